import type { RecordTables } from '../domain';
import { DAY_MS, type DemoContext } from './demo-context';

/** A small inter-rater study of passive ankle dorsiflexion on invented volunteers (8 subjects, 2 raters, 2 trials). */
export function demoReliabilityStudy(ctx: DemoContext, team: { deviceIds: string[]; clinicianIds: string[] }): void {
  const { rng, tables, idAt, stamps } = ctx;
  const { deviceIds, clinicianIds } = team;
  const studyMs = ctx.endMs - 60 * DAY_MS;
  const trials: RecordTables['reliabilityStudies']['trials'][number][] = [];
  const bias = [0, rng.normal(0, 1.5)];
  for (let s = 1; s <= 8; s++) {
    const truth = rng.uniform(5, 20);
    for (let rater = 0; rater < 2; rater++) {
      for (let trial = 1; trial <= 2; trial++) {
        trials.push({ subjectLabel: `V${String(s).padStart(2, '0')}`, raterIndex: rater, trial, value: Math.round(truth + bias[rater]! + rng.normal(0, 2.5)) });
      }
    }
  }
  tables.reliabilityStudies.push({
    id: idAt(studyMs), ...stamps(studyMs, deviceIds[0]!, clinicianIds[0]!), title: 'Ankle dorsiflexion, two raters, two trials (demo volunteers)',
    measureCode: 'rom', siteCode: 'ankle-dorsiflexion', design: 'inter-rater', raterIds: [clinicianIds[0]!, clinicianIds[2]!], trials, notes: null, adoption: null,
  });

}
