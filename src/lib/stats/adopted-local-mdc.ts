import type { LocalMdc } from './choose-mdc';

/** What adoptedLocalMdc reads of a reliability study. */
export interface AdoptableStudy {
  readonly measureCode: string;
  readonly siteCode: string;
  readonly title: string;
  readonly deleted?: boolean;
  readonly adoption?: { readonly mdc95: number; readonly iccForm: string; readonly adoptedAt: string } | null;
}

/**
 * The MDCs a team adopted from its own reliability studies, one per measure and site: the latest
 * adoption wins; a study without adoption (or withdrawn, null) leaves the catalogue's reference.
 * Citation "title, ICC form, adopted YYYY-MM-DD". Cost O(studies). Never throws.
 */
export function adoptedLocalMdc(studies: readonly AdoptableStudy[]): LocalMdc[] {
  const latest = new Map<string, { mdc: LocalMdc; at: string }>();
  for (const study of studies) {
    const adoption = study.adoption;
    if (study.deleted || !adoption) continue;
    const key = `${study.measureCode}|${study.siteCode}`;
    const previous = latest.get(key);
    if (previous && previous.at >= adoption.adoptedAt) continue;
    latest.set(key, {
      at: adoption.adoptedAt,
      mdc: {
        measureCode: study.measureCode,
        siteCode: study.siteCode,
        quantity: null,
        value: adoption.mdc95,
        citation: `${study.title}, ${adoption.iccForm}, adopted ${adoption.adoptedAt.slice(0, 10)}`,
      },
    });
  }
  return [...latest.values()].map((entry) => entry.mdc);
}
