/**
 * The words of the unsaved-drafts list (OtherDrafts) shared by the therapist's forms (the visit and
 * the home programme). English only for now, like therapist-messages.ts: a second language is one
 * more object of this shape. Messages with numbers are functions.
 */
export const DRAFT_MESSAGES = {
  heading: (count: number, subject: string) => `${count === 1 ? 'Another unsaved draft' : `${count} other unsaved drafts`} ${subject}`,
  formHolds: (what: string) => `The form below holds ${what}. Continue one of these instead, or discard what is no longer needed.`,
  thisTabsDraft: "this tab's draft",
  draftLine: (where: string, keptAt: string, size: string) => `Draft ${where}, last kept ${keptAt} (${size})`,
  openElsewhere: 'open in another tab',
  leftBehind: 'left by a closed tab or an interrupted session',
  continueDraft: 'Continue this draft',
  discardIt: 'Discard it',
  saveInThatTab: 'Save or discard it in that tab.',
  confirmContinue: 'Continue that draft? The values in the form now are replaced.',
  confirmDiscard: 'Discard that draft? Its values will be lost.',
  draftGone: 'That draft is gone (continued or saved in another tab).',
};
