import { mdcSourceLine, type MdcProvenance, type OutcomeSeries } from '../stats';

// How the referral report writes one series' values, changes and MDCs (referralReport's wording of
// numbers; the fixed words of the page and the PDF are in report-wording.ts).

/** A value as the report prints it: the grade label, or the number (≤ 2 decimals) with its unit. */
export function valueText(s: OutcomeSeries, value: number): string {
  if (s.ordinalLabels) return s.ordinalLabels[value] ?? String(value);
  // An index keeps two decimals (1.10), as the verdict sentence prints it; angles and scores drop a trailing .0.
  return s.measure.kind === 'index' ? value.toFixed(2) : `${+value.toFixed(1)}${s.unitLabel}`;
}

function signedText(value: number, s: OutcomeSeries): string {
  const decimals = s.measure.kind === 'index' ? 2 : 1;
  const rounded = +value.toFixed(decimals);
  const text = (n: number) => (decimals === 2 ? n.toFixed(2) : String(n));
  // A true minus sign, as printed clinical letters use; "+" on a rise; 0 unsigned.
  return rounded > 0 ? `+${text(rounded)}` : rounded < 0 ? `−${text(-rounded)}` : '0';
}

/** A change, or a range of changes (a two-grade baseline), with its unit: "−2 grade steps", "+5 to +15°". */
export function changeText(s: OutcomeSeries, range: readonly [number, number]): string {
  const [a, b] = range[0] <= range[1] ? range : [range[1], range[0]];
  const unit = s.ordinalLabels ? (Math.abs(a) === 1 && a === b ? ' grade step' : ' grade steps') : s.unitLabel;
  return a === b ? `${signedText(a, s)}${unit}` : `${signedText(a, s)} to ${signedText(b, s)}${unit}`;
}

/** The MDC used, e.g. "1 grade step", "10°", or "none". */
export function mdcValueText(s: OutcomeSeries, mdc: MdcProvenance | null): string {
  if (!mdc) return 'none';
  const value = +mdc.value.toFixed(2);
  return s.ordinalLabels ? `${value} grade step${value === 1 ? '' : 's'}` : `${value}${s.unitLabel}`;
}

/** The note for an MDC: its full source for a reader who wants to check it, or why there is none. */
export function mdcNote(s: OutcomeSeries, mdc: MdcProvenance | null, note: string | null): string {
  if (!mdc) return mdcSourceLine(null, s.unitLabel, s.ordinalLabels !== null, note);
  switch (mdc.source) {
    case 'local':
      return `MDC from your team's own reliability study: ${mdc.citation}.`;
    case 'reference':
      return `MDC from a published figure: ${mdc.citation}.`;
    default:
      return 'MDC of one whole grade step: common practice for ordinal scales; no published MDC exists.';
  }
}

/** "3 measures", "1 week": a count with its noun. */
export function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}
