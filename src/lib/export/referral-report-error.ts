/** Refused input of the referral report: names the field and what is wrong with it. */
export class ReferralReportError extends Error {
  override readonly name = 'ReferralReportError';
}
