import { describe, expect, it } from 'vitest';
import { MEASURE_CATALOGUE } from '../../../src/lib/domain';
import { VISIT_TEMPLATES, checkVisitTemplate, findVisitTemplate, templateTests, type VisitTemplate } from '../../../src/lib/domain/visit-templates';
import { emptyDraft } from '../../../src/lib/ui/assessment-draft';
import type { AngleRow } from '../../../src/lib/ui/visit-form-layout';
import { draftFromProtocol, protocolFromDraft } from '../../../src/lib/ui/visit-protocol';

// The templates are checked against the catalogue itself (not a copy of it): a renamed site or a
// measure that loses its modes makes this fail.
describe('visit templates', () => {
  it('every template is valid against the measure catalogue', () => {
    expect(VISIT_TEMPLATES.length).toBeGreaterThan(0);
    for (const t of VISIT_TEMPLATES) expect(checkVisitTemplate(t), t.code).toEqual([]);
    const codes = VISIT_TEMPLATES.map((t) => t.code);
    expect(new Set(codes).size).toBe(codes.length);
    expect(findVisitTemplate('ankle-after-injection')?.label).toBe('Ankle after an injection');
  });

  it('the check refuses what the catalogue does not hold (each fault named)', () => {
    const bad: VisitTemplate = {
      code: 'bad',
      label: 'Bad',
      purpose: '',
      position: 'upside-down' as VisitTemplate['position'],
      tests: [
        { measureCode: 'mas', siteCode: 'ankle-soleus', sides: 'affected', mode: null, instrument: null }, // a Tardieu site, not a MAS one
        { measureCode: 'no-such-scale', siteCode: 'knee', sides: 'both', mode: null, instrument: null },
        { measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', sides: 'affected', mode: null, instrument: null },
        { measureCode: 'mas', siteCode: 'elbow-flexors', sides: 'none', mode: null, instrument: null },
        { measureCode: 'rom', siteCode: 'knee-flexion', sides: 'both', mode: null, instrument: 'universal-goniometer' },
        { measureCode: 'mas', siteCode: 'wrist-flexors', sides: 'both', mode: 'passive', instrument: null },
        { measureCode: 'mas', siteCode: 'elbow-flexors', sides: 'affected', mode: null, instrument: null }, // test 4 again
      ],
    };
    const problems = checkVisitTemplate(bad);
    expect(problems.some((p) => p.includes('position "upside-down"'))).toBe(true);
    expect(problems.some((p) => p.includes('test 1') && p.includes('"ankle-soleus" is not a site'))).toBe(true);
    expect(problems.some((p) => p.includes('test 2') && p.includes('no measure "no-such-scale"'))).toBe(true);
    expect(problems.some((p) => p.includes('test 3') && p.includes('whole person'))).toBe(true);
    expect(problems.some((p) => p.includes('test 4') && p.includes('names a side'))).toBe(true);
    expect(problems.some((p) => p.includes('test 5') && p.includes('mode null'))).toBe(true);
    expect(problems.some((p) => p.includes('test 6') && p.includes('mode passive'))).toBe(true);
    expect(problems.some((p) => p.includes('test 7') && p.includes('listed twice'))).toBe(true);
  });

  it('lays out the affected sides, both when none is recorded, and whole-person ratings once', () => {
    const legs = findVisitTemplate('leg-home-review') as VisitTemplate;
    const left = templateTests(legs, ['left']);
    expect(left.filter((t) => t.side === 'right')).toEqual([]);
    expect(left.filter((t) => t.side === 'none').map((t) => t.measureCode)).toEqual(['penn-spasm-frequency', 'spasm-severity']);
    expect(left.length).toBe(legs.tests.length);
    const unknown = templateTests(legs, []);
    // 6 lateral tests × 2 sides + 2 ratings
    expect(unknown.length).toBe(6 * 2 + 2);
    expect(templateTests(legs, ['right', 'left']).length).toBe(unknown.length);
    expect(templateTests(legs, ['right', 'left'])[0]?.side).toBe('left');
  });

  it('is laid out in the visit form exactly like a carried protocol (every row carried, its mode and instrument kept)', () => {
    for (const template of VISIT_TEMPLATES) {
      const tests = templateTests(template, ['right']);
      const draft = draftFromProtocol('p', '2026-12-01T09:30', tests, emptyDraft('p', ''));
      const rows = [...draft.rows.mas!, ...draft.rows.tardieu!, ...draft.rows.rom!];
      expect(rows.length, template.code).toBe(tests.filter((t) => t.side !== 'none').length);
      expect(rows.every((r) => r.carried === true && r.side === 'right'), template.code).toBe(true);
      for (const r of draft.rows.rom as AngleRow[]) {
        const t = template.tests.find((x) => x.measureCode === 'rom' && x.siteCode === r.siteCode);
        expect([r.mode, r.instrument]).toEqual([t?.mode, t?.instrument]);
      }
      // Saved, those rows become the protocol for next time (ratings come back once recorded).
      const lateral = tests.filter((t) => t.side !== 'none').map((t) => `${t.measureCode}|${t.siteCode}|${t.side}`);
      expect(protocolFromDraft(draft).map((t) => `${t.measureCode}|${t.siteCode}|${t.side}`).sort()).toEqual([...lateral].sort());
    }
  });

  it('uses only measures the form lays out as rows or ratings (instrument indices come from their own flows)', () => {
    const kinds = new Set(VISIT_TEMPLATES.flatMap((t) => t.tests.map((x) => MEASURE_CATALOGUE.find((m) => m.code === x.measureCode)?.kind)));
    for (const k of kinds) expect(['ordinal', 'tardieu', 'angle', 'rating']).toContain(k);
  });
});
