import { PATIENT_MESSAGES, isPatientLanguage, type PatientLanguage, type PatientMessages } from './patient-messages';

const KEY = 'kinnote.patient-language';

function readSaved(): PatientLanguage | null {
  try {
    const saved = typeof localStorage === 'undefined' ? null : localStorage.getItem(KEY);
    return isPatientLanguage(saved) ? saved : null;
  } catch {
    return null;
  }
}

/** The phone's first guess: the browser's own language when Kinnote speaks it, else English. */
function fromBrowser(): PatientLanguage {
  const wanted = typeof navigator === 'undefined' ? [] : navigator.languages ?? [navigator.language];
  for (const tag of wanted) {
    const base = tag.toLowerCase().split('-')[0];
    if (isPatientLanguage(base)) return base;
  }
  return 'en';
}

/**
 * The language of the patient's screens on this phone: chosen on the phone (kept in localStorage,
 * a display preference and no patient data, so it stays when patient mode is left), else the
 * browser's language. Therapist screens stay English.
 */
class PatientLanguageState {
  current = $state<PatientLanguage>(readSaved() ?? fromBrowser());

  get messages(): PatientMessages {
    return PATIENT_MESSAGES[this.current];
  }

  choose(language: PatientLanguage): void {
    this.current = language;
    try {
      localStorage.setItem(KEY, language);
    } catch {
      // Private mode without storage: the choice lasts until the page is closed.
    }
  }
}

export const patientLanguage = new PatientLanguageState();
