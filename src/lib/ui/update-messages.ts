/**
 * The words of the update banner (UpdateBanner.svelte), English only for now like shared-messages.ts.
 * A module of its own: the banner is in every first screen (first-load budget), and the other shared
 * components' words load with them, on demand.
 */
export const updateReady = 'A new version of Kinnote is ready. Your entries are saved; update when you are between tasks.';
export const updateNow = 'Update now';
