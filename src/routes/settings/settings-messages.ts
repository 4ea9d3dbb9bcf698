/**
 * The words of the settings page and its sections (VaultSection, ProfileSection, StorageSection,
 * BackupSection, RestoreForm), English only for now (see ../home-messages.ts). The team section has its own
 * words in lib/ui/team. Messages with numbers are functions.
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

export const pageTitle = 'Settings · Kinnote';
export const heading = 'Settings';
export const saved = 'Saved.';
export const unlocking = 'Unlocking…';
export const unlock = 'Unlock';

// Names and notes (the vault)
export const vaultTitle = 'Names and notes';
export const vaultUnlocked = 'Unlocked: names and notes are readable on this device.';
export const lockNow = 'Lock now';
export const vaultLocked = 'Locked: names and notes are hidden. Clinical values stay available under patient codes.';
export const passphrase = 'Passphrase';
export const noPassphrase = 'No passphrase set yet:';
export const setUpDevice = 'set up this device';
export const lockAfter = 'Lock by itself after';
export const minutesIdle = (minutes: number) => `${plural(minutes, 'minute', 'minutes')} idle`;
export const lockNever = 'Never (not advised)';
export const saveLockTime = 'Save lock time';

// Clinician and device
export const profileTitle = 'Clinician and device';
export const yourName = 'Your name';
export const deviceName = 'Device name';
export const save = 'Save';
export const notSetUp = 'This device is not set up yet:';
export const setItUp = 'set it up';

// Storage
export const storageTitle = 'Storage on this device';
export const using = 'Using';
export const ofAbout = (quota: string, persisted: boolean | null) => `of about ${quota} available${persisted ? ', kept even when space runs low' : ''}.`;
export const storageUsed = 'Storage used';
export const noStorageFigures = 'This browser does not report storage use.';
export const askToKeep = 'Ask the browser to keep the data';
export const keepGranted = 'The browser will keep Kinnote’s data even when space runs low.';
export const keepDenied = 'The browser did not promise to keep the data: export backups regularly. (Installing the app often helps.)';
export const keepUnknown = 'This browser cannot promise to keep the data: export backups regularly.';

// Backup and import
export const backupTitle = 'Backup';
export const whatToSave = 'What to save';
export const everythingEncrypted = (unlocked: boolean) =>
  `Everything, encrypted with its own passphrase${unlocked ? ' (names and notes included)' : ' (names and notes left out while locked)'}`;
export const clinicalOnly = 'Clinical records only, not encrypted (no names or notes)';
export const backupPassphrase = 'Backup passphrase';
export const backupPassphraseRule = 'Give the backup its own passphrase of at least 10 characters.';
export const savingRecords = (done: string, total: string) => `Saving records: ${done} of ${total}`;
export const cancelBackup = 'Cancel backup';
export const preparing = 'Preparing…';
export const saveBackup = 'Save a backup file';
export const backupSaved = (records: string, megabytes: string) => `Saved ${records} records (${megabytes} MB).`;
export const backupCancelled = 'Backup cancelled. Nothing was saved; your records are unchanged.';
export const backupFailed = (reason: string) => `The backup failed: ${reason}`;
export const importTitle = 'Import or merge a backup';
export const importHint =
  'Records merge by id: the newer change wins, every conflict is logged and listed here, and importing the same file twice changes nothing. A damaged or altered file is refused whole.';
export const backupFile = 'Backup file';
export const itsPassphrase = 'Its passphrase, if encrypted';
export const checking = 'Checking…';
export const importButton = 'Import';
export const chooseFile = 'Choose a backup file first.';
export const importRefused = (file: string, reason: string) => `${file}: ${reason} Nothing was imported.`;
export const restored = (file: string, records: number) => `${file}: restored, ${records.toLocaleString()} records checked and merged.`;
export const restoreCancelled = 'Restore cancelled. Your records are as they were before it started.';
/** The streamed restore's progress line: its phase, then "done" or "done of total". */
export const restoreProgress = (phase: 'checking' | 'writing' | 'undoing', done: number, total: number | null) =>
  `${phase === 'checking' ? 'Checking the file' : phase === 'writing' ? 'Restoring records' : 'Undoing'}: ${done.toLocaleString()}${total !== null ? ` of ${total.toLocaleString()}` : ''}`;
export const cancelRestore = 'Cancel restore';
export const mergeReport = 'Merge report';
export const imported = 'Imported.';
export const nothingNew = 'Nothing new: this backup was already here.';
export const mergeCounts = (inserted: number, replaced: number, unchanged: number, keptLocal: number) =>
  `New records: ${inserted}; replaced by newer: ${replaced}; unchanged: ${unchanged}; kept local (newer here): ${keptLocal}.`;
export const conflicts = (n: number) => `${n} conflict${n === 1 ? '' : 's'}, each logged in the audit trail:`;
export const conflictLine = (table: string, id: string, keptImported: boolean, newer: boolean) =>
  `${table} ${id}: kept the ${keptImported ? 'imported' : 'local'} version (${newer ? 'newer' : 'same time, decided by content'})`;
