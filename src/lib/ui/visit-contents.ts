import { findMeasure, type Observation } from '$lib/domain';

const INSTRUMENT_WORDS: Record<string, string> = { 'universal-goniometer': 'goniometer', inclinometer: 'inclinometer', 'phone-sensor': 'phone' };

/**
 * What one visit holds, as one line for the patient's list of visits: every test once, in the order
 * first recorded, with the instrument where the measure names one ("Modified Ashworth Scale · Range of
 * motion (goniometer, phone) · Pendulum test"). The pendulum's indices are one test (their panel).
 */
export function visitContents(observations: ReadonlyArray<Pick<Observation, 'measureCode' | 'instrument' | 'deleted'>>): string {
  const names = new Map<string, Set<string>>();
  for (const o of observations) {
    if (o.deleted) continue;
    const measure = findMeasure(o.measureCode);
    const name = measure?.panel?.label ?? measure?.label ?? o.measureCode;
    const instruments = names.get(name) ?? new Set<string>();
    if (o.instrument) instruments.add(INSTRUMENT_WORDS[o.instrument] ?? o.instrument);
    names.set(name, instruments);
  }
  // Where instruments are named they replace the label's own note on the method ("Range of motion (goniometry)").
  const plain = (label: string) => label.replace(/\s*\([^)]*\)$/, '');
  return [...names].map(([name, instruments]) => (instruments.size > 0 ? `${plain(name)} (${[...instruments].join(', ')})` : name)).join(' · ');
}
