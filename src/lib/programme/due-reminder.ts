const TIME = /^([01]\d|2[0-3]):([0-5]\d)$/;

/**
 * The latest reminder time of today that has passed by `nowTime` ("HH:MM", the phone's clock), or
 * null when none has (or all of today's sessions are already ticked: nothing is due). This is the
 * reminder the open app shows on screen; it never stands for a notification that was sent.
 * Malformed times are ignored.
 */
export function dueReminderTime(times: readonly string[], nowTime: string, sessionsLeftToday: number): string | null {
  if (sessionsLeftToday <= 0 || !TIME.test(nowTime)) return null;
  let due: string | null = null;
  for (const t of times) if (TIME.test(t) && t <= nowTime && (due === null || t > due)) due = t;
  return due;
}
