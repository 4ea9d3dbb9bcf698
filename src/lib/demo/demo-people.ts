/**
 * Invented people for the demo. The given names are ordinary first names; the family names are
 * invented compounds chosen to sound fictional. No combination is meant to describe anyone, and
 * every identity says so in its contact field.
 */
export const DEMO_GIVEN_NAMES = [
  'Alma', 'Bram', 'Cleo', 'Dario', 'Edda', 'Finn', 'Greta', 'Hugo', 'Ines', 'Jonas', 'Kaia', 'Luca',
  'Mira', 'Nils', 'Odile', 'Pavel', 'Rosa', 'Sami', 'Tova', 'Ugo', 'Vera', 'Wim', 'Yara', 'Zeno',
] as const;

export const DEMO_FAMILY_NAMES = [
  'Ashcombe-Demo', 'Brindlewick', 'Copperfold', 'Dunmarrow', 'Elderquist', 'Fennimoor', 'Gorsethwaite',
  'Hollowell-Test', 'Ivyreach', 'Juniperholt', 'Kestrelwick', 'Lanternby', 'Mossgrove', 'Nettlecombe',
  'Oakenshale', 'Pebblewhite', 'Quillmere', 'Rookhallow',
] as const;

/** The invented team: display names for three clinicians of an invented community service. */
export const DEMO_TEAM = [
  { displayName: 'Noor Halvorsen-Demo (physiotherapist)', profession: 'physiotherapist' },
  { displayName: 'Teodor Ashwell-Demo (occupational therapist)', profession: 'occupational-therapist' },
  { displayName: 'Priya Lindqvist-Demo (physiotherapist)', profession: 'physiotherapist' },
] as const;

export const DEMO_FICTION_NOTICE = 'Invented demo person: not a real patient';

/** Invented session notes (no real cases). */
export const DEMO_NOTES = [
  'Reports stiffer mornings after a cold spell; evenings easier.',
  'Walked in with a new pair of shoes; heel strike looked better.',
  'Tired after a long week at work; tested later in the day than usual.',
  'Carer says the stretching sheet lives on the fridge now.',
  'Slept badly; spasms woke them twice this week.',
  'Keen to try cycling again; discussed pacing.',
] as const;
