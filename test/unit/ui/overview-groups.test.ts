import { describe, expect, it } from 'vitest';
import { findMeasure } from '../../../src/lib/domain/index';
import { seriesTitle } from '../../../src/lib/stats/outcome-series';
import { overviewGroups } from '../../../src/lib/ui/overview-groups';

function series(measureCode: string, siteCode: string, side: 'left' | 'right' | 'none') {
  const measure = findMeasure(measureCode)!;
  return { key: `${measureCode}|${siteCode}|${side}`, title: seriesTitle(measure, siteCode, side, null), measure };
}

const mas = ['ankle-plantarflexors', 'hip-adductors', 'knee-extensors'].flatMap((site) => [series('mas', site, 'left'), series('mas', site, 'right')]);
const pendulum = ['pendulum-ri', 'pendulum-ri-normalised', 'pendulum-first-swing', 'pendulum-resting-angle', 'pendulum-swing-count'].map((code) => series(code, 'knee', 'left'));
const penn = series('penn-spasm-frequency', 'whole-body', 'none');

describe('overviewGroups', () => {
  it('puts the sites of a measure under its name and the pendulum indices under one panel; a lone series keeps its title', () => {
    const groups = overviewGroups([...mas, ...pendulum, penn], 100);
    expect(groups.map((g) => g.label)).toEqual(['Modified Ashworth Scale', 'Pendulum test · Left knee (leg-drop pendulum)', null]);
    expect(groups[0]!.rows.map((r) => r.label).sort()).toEqual(
      ['Left ankle plantarflexors', 'Right ankle plantarflexors', 'Left hip adductors', 'Right hip adductors', 'Left knee extensors (quadriceps)', 'Right knee extensors (quadriceps)'].sort(),
    );
    expect(groups[0]!.rows).toHaveLength(6);
    expect(groups[1]!.rows[0]!.label).toBe('Relaxation index (R2)');
    expect(groups[2]!.rows[0]!.label).toBe(penn.title);
    expect(groups.every((g) => !g.folded)).toBe(true);
  });

  it('folds the biggest groups first until the table fits the budget (header rows count)', () => {
    // Open: 1 + 6 + 1 + 5 + 1 = 14 rows. Budget 10: fold the 6 MAS rows → 8.
    const groups = overviewGroups([...mas, ...pendulum, penn], 10);
    expect(groups.map((g) => g.folded)).toEqual([true, false, false]);
    // Budget 4: both groups fold → 1 + 1 + 1 = 3.
    expect(overviewGroups([...mas, ...pendulum, penn], 4).map((g) => g.folded)).toEqual([true, true, false]);
    // A table of lone series cannot fold: it stays as it is.
    expect(overviewGroups([penn], 0).map((g) => g.folded)).toEqual([false]);
  });

  it('says where each pendulum index was taken when both knees were tested', () => {
    const both = [...pendulum.slice(0, 2), series('pendulum-ri', 'knee', 'right')];
    const [group] = overviewGroups(both, 100);
    expect(group!.label).toBe('Pendulum test');
    expect(group!.rows.map((r) => r.label)).toContain('Right knee (leg-drop pendulum) · Relaxation index (R2)');
  });
});
