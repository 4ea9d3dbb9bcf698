/**
 * The team's one time line. Every answer of the team server carries its clock in this header; a
 * device measures how far its own clock is from it and stamps records by the server's time
 * (store.clock), so that "newer wins" follows the order things happened in and a device whose clock
 * is off can still take its teammates' records (the 10-minute future-stamp check compares with the
 * corrected clock). DEVELOPERS.md, "Clock offset", says why this and not a looser import check.
 */
export const SERVER_TIME_HEADER = 'X-Kinnote-Server-Time';

/** A new offset is taken only when it differs from the one in use by more than this (ms): measurement noise must not make stamps jitter. */
export const OFFSET_TOLERANCE_MS = 2000;

/**
 * The server's clock minus the device's, from one exchange: the server's stamp against the middle of
 * the request (sent at `sentMs`, answered at `receivedMs`, device clock), which is right to within half
 * the round trip. Null when the header is absent or not a time.
 */
export function measureOffset(headerValue: string | null, sentMs: number, receivedMs: number): number | null {
  if (headerValue === null || !/^\d{1,15}$/.test(headerValue.trim())) return null;
  return Number(headerValue) - (sentMs + receivedMs) / 2;
}
