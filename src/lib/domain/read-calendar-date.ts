/**
 * Reads a calendar date written YYYY-MM-DD that exists (no 2025-02-30: JavaScript's Date would roll
 * it over to 2 March) and lies between `earliest` and `latest` (both YYYY-MM-DD, inclusive). The one
 * date reader of command-line options and hand-typed dates. Never throws.
 */
export function readCalendarDate(raw: string, earliest: string, latest: string): { ok: true; value: string } | { ok: false; reason: string } {
  const text = raw.trim();
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return { ok: false, reason: `"${text.slice(0, 40)}" is not a date YYYY-MM-DD` };
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  // setUTCFullYear, not Date.UTC: Date.UTC maps years 0–99 to 1900–1999.
  const d = new Date(0);
  d.setUTCFullYear(year, month - 1, day);
  if (d.getUTCFullYear() !== year || d.getUTCMonth() !== month - 1 || d.getUTCDate() !== day) return { ok: false, reason: `${text} does not exist in the calendar` };
  if (text < earliest || text > latest) return { ok: false, reason: `${text} is outside ${earliest} to ${latest}` };
  return { ok: true, value: text };
}
