/**
 * The words of the team section of the settings page (TeamSection, TeamDevices) and of the background
 * sync's status line (team-sync.svelte.ts), English only for now (see ../../../routes/home-messages.ts).
 * Named exports, so the layout's on-demand sync keeps only the status words it uses. Messages with
 * numbers or names are functions.
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** An instant not yet reached ("last seen never"). */
export const never = 'never';
/** The label a device joins with when the therapist gives none (stored on the team server). */
export const defaultDeviceLabel = 'Kinnote device';

// Joining a team
export const heading = 'Team';
export const intro = "Optional: keep this device in step with your team's other devices through your team server. Everything keeps working offline.";
export const serverAddress = 'Team server address';
export const serverPlaceholder = 'https://team.example';
export const enrolmentCode = 'Enrolment code';
export const thisDeviceName = "This device's name";
export const unlockFirst = 'Unlock names and notes first: the team key is kept sealed by this device.';
export const joining = 'Joining…';
export const joinTeam = 'Join team';

// This device in its team
/** "this device is an admin", "this device is a clinician", the auditor's role explained. */
export const thisDeviceIs = (role: string) =>
  `this device is a${role === 'admin' || role === 'auditor' ? 'n' : ''} ${role}${role === 'auditor' ? ' (measurements and codes only, no names or notes)' : ''}`;
export const syncing = 'Syncing…';
export const lastSynced = (when: string) => `Last synced: ${when}`;
export const changesWaiting = (n: number) => `${plural(n, 'change', 'changes')} waiting`;
export const conflictsToLook = (n: number) => `${plural(n, 'conflict', 'conflicts')} to look at`;
export const syncNow = 'Sync now';
export const conflicts = 'Conflicts';
export const conflictsExplained = "Two devices changed the same record. The later change was kept everywhere; the other is in the record's audit history.";
/** Why a conflict was settled as it was: the later change, or (same time) by content. */
export const conflictReason = (reason: string) => (reason === 'newer' ? 'later change' : 'same time, settled by content');
export const leaveTeam = 'Leave the team on this device';

// Enrolling another device (admin)
export const newDeviceRole = "New device's role";
export const roleClinician = 'Clinician';
export const roleAuditor = 'Auditor (no names or notes)';
export const roleAdmin = 'Admin';
export const makeCode = 'Make a one-time code (24 hours)';
export const codeLabel = 'Code:';
export const validUntil = (when: string) => `, valid until ${when}. Give it to the new device's user in person.`;

// The team's devices (admin)
export const teamDevices = 'Team devices';
export const thisDeviceMark = ' (this device)';
export const revokedMark = ' · revoked';
export const enrolledAndSeen = (enrolled: string, seen: string) => `Enrolled ${enrolled} · last seen ${seen}`;
export const confirmRevoking = (label: string) => `Confirm revoking ${label}`;
export const revokeQuestion = (label: string) => `Revoke ${label}? It stops syncing at once and cannot rejoin with its old token. Its own records stay on it.`;
export const revokeDevice = (label: string) => `Revoke ${label}`;
export const keepIt = 'Keep it';
export const revokeAsk = 'Revoke…';
export const revoked = (label: string) => `${label} is revoked: it can no longer sync. What it recorded stays on it.`;
export const refreshList = 'Refresh the list';
export const loading = 'Loading…';

// The background sync's status line
export const waitingForUnlock = 'Waiting: unlock names and notes to sync (they travel sealed under the team key).';
export const deviceRevoked =
  'A team admin revoked this device: it no longer syncs. Everything recorded here stays on this device; save a backup, or leave the team below.';
export const offline = 'Offline: changes wait on this device.';
