/**
 * The one reader of numbers typed by people or written by other programs: every Kinnote file
 * reader (pendulum, motion and reliability CSV) and every command-line option goes through it, so a
 * value is accepted or refused the same way everywhere.
 *
 * Accepted: optional spaces and one pair of double quotes around [+-]digits[.digits][e[+-]digits]
 * (also ".5"). Refused, each with its reason: an empty field; anything else, including hexadecimal
 * ("0x10", which Number() would read as 16), binary, "1_000", words and "NaN"/"Infinity"; and a
 * decimal too large for a float64 ("1e400", which Number() would read as Infinity).
 */
export type DecimalReading = { readonly ok: true; readonly value: number } | { readonly ok: false; readonly reason: 'empty value' | 'non-numeric value' | 'non-finite value' };

/**
 * Strict decimal in text[start, end) (see above). Returns NaN for anything that is not a decimal
 * and ±Infinity for overflow, so the caller can tell the reasons apart; allocation-free on the
 * digits scan (the pendulum reader calls it once per cell). Cost: O(end − start).
 */
export function decimalValue(text: string, start = 0, end = text.length): number {
  while (start < end && isSpace(text.charCodeAt(start))) start++;
  while (end > start && isSpace(text.charCodeAt(end - 1))) end--;
  if (end - start >= 2 && text.charCodeAt(start) === 34 && text.charCodeAt(end - 1) === 34) {
    start++;
    end--;
  }
  let i = start;
  let c = text.charCodeAt(i);
  if (c === 43 || c === 45) i++;
  let digits = 0;
  while (i < end && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
    i++;
    digits++;
  }
  if (i < end && text.charCodeAt(i) === 46) {
    i++;
    while (i < end && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      digits++;
    }
  }
  if (digits === 0) return Number.NaN;
  if (i < end && (text.charCodeAt(i) | 32) === 101) {
    i++;
    c = text.charCodeAt(i);
    if (c === 43 || c === 45) i++;
    let exponentDigits = 0;
    while (i < end && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      exponentDigits++;
    }
    if (exponentDigits === 0) return Number.NaN;
  }
  if (i !== end) return Number.NaN;
  return Number(text.slice(start, end));
}

/** Why a field that decimalValue did not read as finite was refused. */
export function decimalProblem(raw: string, value: number): 'empty value' | 'non-numeric value' | 'non-finite value' {
  const trimmed = raw.trim();
  if (trimmed === '' || trimmed === '""') return 'empty value';
  return Number.isNaN(value) && !/^"?[+-]?(nan|inf(inity)?)"?$/i.test(trimmed) ? 'non-numeric value' : 'non-finite value';
}

/** Reads one field as a finite decimal, or says why not. Never throws. */
export function readDecimal(raw: string): DecimalReading {
  const value = decimalValue(raw);
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, reason: decimalProblem(raw, value) };
}

/**
 * Reads a whole number between `min` and `max` (inclusive; both safe integers), as an option value
 * like a port or a number of days. Returns the number, or a reason naming the allowed range.
 */
export function readWholeNumber(raw: string, min: number, max: number): { ok: true; value: number } | { ok: false; reason: string } {
  const reading = readDecimal(raw);
  if (!reading.ok) return { ok: false, reason: `${reading.reason}; expected a whole number from ${min} to ${max}` };
  if (!Number.isInteger(reading.value) || reading.value < min || reading.value > max) return { ok: false, reason: `expected a whole number from ${min} to ${max}` };
  return { ok: true, value: reading.value };
}

function isSpace(code: number): boolean {
  return code === 32 || code === 9 || code === 13;
}
