import { ENGLISH_MESSAGES, isPatientLanguage, loadPatientMessages, type PatientLanguage, type PatientMessages } from './patient-messages';

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
  #chosen = $state<PatientLanguage>(readSaved() ?? fromBrowser());
  #catalogues = $state.raw<Partial<Record<PatientLanguage, PatientMessages>>>({ en: ENGLISH_MESSAGES });

  constructor() {
    void this.#load(this.#chosen);
  }

  /** The language chosen on this phone (its catalogue may still be loading). */
  get chosen(): PatientLanguage {
    return this.#chosen;
  }

  /** The language shown: the chosen one once its catalogue has loaded, English until then (and if it cannot load). */
  get current(): PatientLanguage {
    return this.#catalogues[this.#chosen] ? this.#chosen : 'en';
  }

  get messages(): PatientMessages {
    return this.#catalogues[this.current] ?? ENGLISH_MESSAGES;
  }

  /**
   * Chooses the language (on the phone, or the one the therapist named in a received programme);
   * resolves once its catalogue is loaded (or could not be: English then stays).
   */
  choose(language: PatientLanguage): Promise<void> {
    this.#chosen = language;
    try {
      localStorage.setItem(KEY, language);
    } catch {
      // Private mode without storage: the choice lasts until the page is closed.
    }
    return this.#load(language);
  }

  async #load(language: PatientLanguage): Promise<void> {
    if (this.#catalogues[language]) return;
    try {
      const messages = await loadPatientMessages(language);
      this.#catalogues = { ...this.#catalogues, [language]: messages };
    } catch {
      // The catalogue could not load (a broken cache): the screens stay in English, still usable.
    }
  }
}

export const patientLanguage = new PatientLanguageState();
