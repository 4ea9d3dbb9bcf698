import type { Side } from './record-base';
import { POSITIONS } from './assessment';
import { MEASURE_CATALOGUE } from './measure-catalogue';
import type { Instrument, RomMode } from './observation';

/**
 * Visit templates: the tests a first visit starts from when a patient has no history, chosen by the
 * therapist (or none: start empty). Each is a plain list over the measure catalogue (measure, site,
 * side rule, ROM mode and instrument) plus the test position; the visit form lays a template out
 * exactly like a carried protocol, with "Not tested today" on every row. Saved, the visit's rows
 * become the patient's protocol for next time, so a template is used once per patient.
 *
 * The choice of tests is a project starting point (COMMON PRACTICE, no source): each team adapts the
 * rows in the visit form; the names say what the visit is for, in clinical words.
 */

/** Which sides a test is laid out on: the patient's affected sides (both when none recorded), both, or none (whole-person ratings). */
export type TemplateSideRule = 'affected' | 'both' | 'none';

export interface VisitTemplateTest {
  readonly measureCode: string;
  readonly siteCode: string;
  readonly sides: TemplateSideRule;
  readonly mode: RomMode | null;
  readonly instrument: Instrument | null;
}

export interface VisitTemplate {
  readonly code: string;
  readonly label: string;
  /** One line on when to use it. */
  readonly purpose: string;
  readonly position: (typeof POSITIONS)[number] | null;
  readonly tests: readonly VisitTemplateTest[];
}

/** One test as laid out for a patient: a concrete side ('none' for whole-person ratings). */
export interface TemplateTest {
  readonly measureCode: string;
  readonly siteCode: string;
  readonly side: Side | 'none';
  readonly mode: RomMode | null;
  readonly instrument: Instrument | null;
}

const grade = (measureCode: 'mas' | 'tardieu', siteCode: string, sides: TemplateSideRule = 'affected'): VisitTemplateTest => ({ measureCode, siteCode, sides, mode: null, instrument: null });
const passiveRom = (siteCode: string, sides: TemplateSideRule = 'affected'): VisitTemplateTest => ({ measureCode: 'rom', siteCode, sides, mode: 'passive', instrument: 'universal-goniometer' });
const SPASM_RATINGS: readonly VisitTemplateTest[] = [
  { measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', sides: 'none', mode: null, instrument: null },
  { measureCode: 'spasm-severity', siteCode: 'whole-body', sides: 'none', mode: null, instrument: null },
];

export const VISIT_TEMPLATES: readonly VisitTemplate[] = [
  {
    code: 'ankle-after-injection',
    label: 'Ankle after an injection',
    purpose: 'Calf muscles before and after a botulinum toxin injection or serial casting: tone, catch angles and dorsiflexion.',
    position: 'supine',
    tests: [grade('mas', 'ankle-plantarflexors'), grade('tardieu', 'ankle-gastrocnemius'), grade('tardieu', 'ankle-soleus'), passiveRom('ankle-dorsiflexion')],
  },
  {
    code: 'leg-home-review',
    label: 'Leg tone and spasms at home',
    purpose: 'Hip, knee and ankle tone, a knee catch angle and range, and the spasm ratings (spinal cord injury, multiple sclerosis).',
    position: 'supine',
    tests: [
      grade('mas', 'ankle-plantarflexors'),
      grade('mas', 'knee-extensors'),
      grade('mas', 'knee-flexors'),
      grade('mas', 'hip-adductors'),
      grade('tardieu', 'knee-extensors'),
      passiveRom('knee-flexion'),
      ...SPASM_RATINGS,
    ],
  },
  {
    code: 'arm-after-stroke',
    label: 'Arm and hand after a stroke',
    purpose: 'Elbow, wrist and finger flexor tone, the elbow catch angle and elbow extension.',
    position: 'sitting',
    tests: [grade('mas', 'elbow-flexors'), grade('mas', 'wrist-flexors'), grade('mas', 'finger-flexors'), grade('tardieu', 'elbow-flexors'), passiveRom('elbow-extension')],
  },
];

/**
 * Everything wrong with a template against the measure catalogue (empty when it is usable): unknown
 * measure or site, a side rule that does not fit the measure (lateral or whole-person), a ROM mode or
 * instrument the measure does not take (or one given where it takes none), an unknown position, a
 * test listed twice.
 */
export function checkVisitTemplate(template: VisitTemplate): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  if (template.position !== null && !(POSITIONS as readonly string[]).includes(template.position)) problems.push(`position "${template.position}" is not a test position`);
  template.tests.forEach((t, i) => {
    const where = `${template.code}, test ${i + 1} (${t.measureCode} ${t.siteCode})`;
    const measure = MEASURE_CATALOGUE.find((m) => m.code === t.measureCode);
    if (!measure) return void problems.push(`${where}: no measure "${t.measureCode}" in the catalogue`);
    if (!measure.sites.some((s) => s.code === t.siteCode)) problems.push(`${where}: "${t.siteCode}" is not a site of ${measure.label}`);
    if (measure.lateral && t.sides === 'none') problems.push(`${where}: ${measure.label} names a side; the rule must be "affected" or "both"`);
    if (!measure.lateral && t.sides !== 'none') problems.push(`${where}: ${measure.label} is of the whole person; the side rule must be "none"`);
    const modes = 'modes' in measure ? measure.modes : null;
    const instruments = 'instruments' in measure ? measure.instruments : null;
    if (modes ? t.mode === null || !modes.includes(t.mode) : t.mode !== null) problems.push(`${where}: mode ${String(t.mode)} does not fit ${measure.label}`);
    if (instruments ? t.instrument === null || !instruments.includes(t.instrument) : t.instrument !== null) problems.push(`${where}: instrument ${String(t.instrument)} does not fit ${measure.label}`);
    const key = `${t.measureCode}|${t.siteCode}|${t.mode ?? ''}`;
    if (seen.has(key)) problems.push(`${where}: listed twice`);
    seen.add(key);
  });
  if (template.tests.length === 0) problems.push(`${template.code}: no tests`);
  return problems;
}

/**
 * A template's tests for one patient: "affected" becomes the patient's affected sides (left before
 * right), or both sides when none is recorded, so that no side is silently left out; "both" is left
 * and right; "none" stays a whole-person test.
 */
export function templateTests(template: VisitTemplate, affectedSides: readonly Side[]): TemplateTest[] {
  const affected: readonly Side[] = affectedSides.length > 0 ? (['left', 'right'] as const).filter((s) => affectedSides.includes(s)) : ['left', 'right'];
  return template.tests.flatMap((t) => {
    const sides: ReadonlyArray<Side | 'none'> = t.sides === 'none' ? ['none'] : t.sides === 'both' ? ['left', 'right'] : affected;
    return sides.map((side) => ({ measureCode: t.measureCode, siteCode: t.siteCode, side, mode: t.mode, instrument: t.instrument }));
  });
}

export function findVisitTemplate(code: string): VisitTemplate | undefined {
  return VISIT_TEMPLATES.find((t) => t.code === code);
}
