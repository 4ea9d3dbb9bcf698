// The patient's message catalogue: every language fills every message, Spanish differs from
// English wherever English has words, and dose lines read as written by hand (expected lines
// written by hand, not produced by the code).
import { describe, expect, it } from 'vitest';
import { EMPTY_DOSE } from '../../../src/lib/domain';
import { doseParts } from '../../../src/lib/programme';
import { ENGLISH_MESSAGES, PATIENT_LANGUAGE_NAMES, PATIENT_LANGUAGES, loadPatientMessages } from '../../../src/lib/ui/programme/patient-messages';
import { SPANISH_MESSAGES } from '../../../src/lib/ui/programme/patient-messages-es';

const PATIENT_MESSAGES = { en: ENGLISH_MESSAGES, es: SPANISH_MESSAGES };

const line = (language: 'en' | 'es', dose: typeof EMPTY_DOSE) => doseParts(dose).map(PATIENT_MESSAGES[language].dosePart).join(' · ');

describe('patient messages', () => {
  it('has the same messages in every language, none empty, and no Spanish message left in English', () => {
    const keys = Object.keys(PATIENT_MESSAGES.en).sort();
    for (const language of PATIENT_LANGUAGES) {
      expect(Object.keys(PATIENT_MESSAGES[language]).sort(), language).toEqual(keys);
      for (const [key, value] of Object.entries(PATIENT_MESSAGES[language])) {
        if (typeof value === 'string') expect(value.trim(), `${language}.${key}`).not.toBe('');
      }
    }
    const same = keys.filter((k) => {
      const en = (PATIENT_MESSAGES.en as Record<string, unknown>)[k];
      return typeof en === 'string' && en === (PATIENT_MESSAGES.es as Record<string, unknown>)[k];
    });
    // Only words that are the same in both languages may match.
    expect(same).toEqual([]);
  });

  it('loads each catalogue on demand, and names each language in itself', async () => {
    expect(await loadPatientMessages('es')).toBe(SPANISH_MESSAGES);
    expect(await loadPatientMessages('en')).toBe(ENGLISH_MESSAGES);
    for (const language of PATIENT_LANGUAGES) expect(PATIENT_LANGUAGE_NAMES[language]).toBe(PATIENT_MESSAGES[language].languageName);
  });

  it('words doses in each language (hand-written lines)', () => {
    const calf = { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, daysPerWeek: 5 };
    expect(line('en', calf)).toBe('hold 30 s · 3 repetitions · on 5 days a week');
    expect(line('es', calf)).toBe('mantener 30 s · 3 repeticiones · 5 días a la semana');
    const once = { ...EMPTY_DOSE, repetitions: 1, sets: 1, timesPerDay: 1, daysPerWeek: 1 };
    expect(line('es', once)).toBe('1 repetición · 1 serie · 1 vez al día · 1 día a la semana');
    const splint = { ...EMPTY_DOSE, durationMinutes: 120, timesPerDay: 2 };
    expect(line('es', splint)).toBe('2 h cada vez · 2 veces al día · todos los días');
    expect(line('es', { ...EMPTY_DOSE, overnight: true })).toBe('durante la noche');
  });

  it('makes Spanish plurals and counts in its own words', () => {
    const es = PATIENT_MESSAGES.es;
    expect(es.dueReminder('18:00', 1)).toBe('Aviso de las 18:00: te queda 1 ejercicio por marcar hoy.');
    expect(es.dueReminder('18:00', 3)).toBe('Aviso de las 18:00: te quedan 3 ejercicios por marcar hoy.');
    expect(es.leaveTicks(4, 1)).toBe('tus marcas: 4 (1 día con ejercicios hechos)');
    expect(es.dayTicks(1, 0, 2)).toBe('✓ 1 hecho · ✗ 2 sin hacer');
  });
});
