import type { ValidationIssue } from './domain-error';
import type { RecordBase } from './record-base';

/**
 * How far a record's stamps may run ahead of the reading device's clock: 10 minutes (common
 * practice for devices whose clocks follow network time; a device further off must fix its clock
 * before its files are accepted). A stamp far in the future would win every later merge and could
 * never be followed by a valid edit, so such records are refused, never clamped.
 */
export const MAX_CLOCK_SKEW_MS = 10 * 60 * 1000;

/** No Kinnote record is older than this (the format was made decades later); earlier stamps are damage or forgery. */
export const EARLIEST_TIMESTAMP = '2000-01-01T00:00:00.000Z';

/**
 * Checks the stamps of a record that arrives from outside (a backup, a hand-off): createdAt and
 * updatedAt between EARLIEST_TIMESTAMP and `nowMs` + MAX_CLOCK_SKEW_MS, and createdAt not after
 * updatedAt. Assumes both passed IsoDateTimeSchema (fixed form, so string order is time order).
 * Returns the issues (empty when valid); never throws.
 */
export function checkTimestamps(record: Pick<RecordBase, 'createdAt' | 'updatedAt'>, nowMs: number): ValidationIssue[] {
  const issues: ValidationIssue[] = [];
  const latest = new Date(nowMs + MAX_CLOCK_SKEW_MS).toISOString();
  for (const field of ['createdAt', 'updatedAt'] as const) {
    const stamp = record[field];
    if (stamp < EARLIEST_TIMESTAMP) issues.push({ path: field, message: `${stamp} is before ${EARLIEST_TIMESTAMP}` });
    else if (stamp > latest) {
      issues.push({ path: field, message: `${stamp} is later than this device's clock allows (${latest}, 10 minutes of clock difference); check the exporting device's clock` });
    }
  }
  return issues;
}
