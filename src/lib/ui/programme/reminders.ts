import { readLocalState, writeLocalState, type KinnoteStore } from '$lib/store';

/** Reminder times of day, "HH:MM" in the phone's own time. */
export interface ReminderSettings {
  readonly enabled: boolean;
  readonly times: string[];
}
const KEY = 'local:reminders';
const TIME = /^([01]\d|2[0-3]):[0-5]\d$/;

export async function loadReminders(store: KinnoteStore): Promise<ReminderSettings> {
  const saved = (await readLocalState(store, KEY)) as ReminderSettings | undefined;
  if (saved && typeof saved.enabled === 'boolean' && Array.isArray(saved.times) && saved.times.every((t) => TIME.test(t))) return saved;
  return { enabled: false, times: ['09:00', '18:00'] };
}

export async function saveReminders(store: KinnoteStore, settings: ReminderSettings): Promise<void> {
  await writeLocalState(store, KEY, { enabled: settings.enabled, times: settings.times.filter((t) => TIME.test(t)).sort() });
}

/** What this browser can do about notifications (the screens word it from the patient's catalogue). */
export function notificationSupport(): { state: 'unsupported' | 'denied' | 'default' | 'granted' } {
  if (typeof Notification === 'undefined') return { state: 'unsupported' };
  return { state: Notification.permission };
}

/** Shows one reminder now, through the offline worker when there is one (works in the background on more phones). */
export async function showReminder(body: string): Promise<boolean> {
  if (typeof Notification === 'undefined' || Notification.permission !== 'granted') return false;
  try {
    const registration = await navigator.serviceWorker?.getRegistration();
    if (registration) {
      await registration.showNotification('Kinnote', { body, tag: 'kinnote-home-programme', icon: '/icons/icon-192.png' });
      return true;
    }
    new Notification('Kinnote', { body });
    return true;
  } catch {
    return false;
  }
}

let timers: ReturnType<typeof setTimeout>[] = [];

/**
 * Sets timers for today's remaining reminder times and again each day after. They fire only while
 * this page is alive: browsers stop or throttle timers of pages in the background, and nothing
 * runs once the app is closed (a web page cannot wake itself, and Kinnote has no push server). The
 * reminders screen says exactly this; the Today screen shows a due reminder when it is open.
 */
export function scheduleReminders(settings: ReminderSettings, body: () => string, nowMs: () => number = () => Date.now()): void {
  for (const t of timers) clearTimeout(t);
  timers = [];
  if (!settings.enabled) return;
  for (const time of settings.times) {
    const [h, m] = time.split(':').map(Number) as [number, number];
    const arm = () => {
      const now = new Date(nowMs());
      const at = new Date(now);
      at.setHours(h, m, 0, 0);
      if (at.getTime() <= now.getTime()) at.setDate(at.getDate() + 1);
      timers.push(
        setTimeout(() => {
          void showReminder(body());
          arm();
        }, at.getTime() - now.getTime()),
      );
    };
    arm();
  }
}
