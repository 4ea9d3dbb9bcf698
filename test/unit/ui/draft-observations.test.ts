import { describe, expect, it } from 'vitest';
import { draftConditions, draftObservations, emptyDraft, upgradeDraft, type AssessmentDraft } from '../../../src/lib/ui/assessment-draft';
import { deepFreeze } from '../../support/deep-freeze';

// draftObservations is where every value a person types on the visit form is checked before it is
// saved. The expected observations and field names below are written by hand from the form's rules
// (DEVELOPERS.md, the visit form; the measure catalogue's limits), not produced by the code.

function draft(fill: Partial<AssessmentDraft>): AssessmentDraft {
  return deepFreeze({ ...emptyDraft('p', '2026-12-01T09:30'), ...fill });
}
const masRow = (key: string, siteCode: string, grade: string | null) => ({ key, siteCode, side: 'left' as const, grade });
const tardieuRow = (key: string, r1Deg: string, r2Deg: string, quality: number | null) => ({ key, siteCode: 'ankle-soleus', side: 'right' as const, r1Deg, r2Deg, quality });
const romRow = (key: string, angleDeg: string) => ({ key, siteCode: 'knee-flexion', side: 'left' as const, mode: 'passive' as const, instrument: 'universal-goniometer' as const, angleDeg });
const fields = (d: AssessmentDraft) => draftObservations(d).issues.map((i) => i.field);

describe('draftObservations: the values typed on the visit form', () => {
  it('turns a complete form into observations: a grade with its rank, Tardieu R2 − R1, a decimal comma, the whole-body ratings', () => {
    const { observations, issues } = draftObservations(
      draft({
        rows: { mas: [masRow('m1', 'elbow-flexors', '1+')], tardieu: [tardieuRow('t1', '-10', '5', 2)], rom: [romRow('r1', ' 112,5 ')] },
        ratings: { 'penn-spasm-frequency': 2 },
        painNrs: '3',
      }),
    );
    expect(issues).toEqual([]);
    expect(observations).toEqual([
      // Modified Ashworth 1+ is the third grade (0, 1, 1+, …): rank 2 (REFERENCES.md §9a ordinal codes).
      { measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '1+', rank: 2 } },
      // Spasticity angle = R2 − R1 = 5 − (−10) = 15°.
      { measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'right', mode: null, instrument: null, value: { kind: 'tardieu', r1Deg: -10, r2Deg: 5, quality: 2, spasticityAngleDeg: 15 } },
      { measureCode: 'rom', siteCode: 'knee-flexion', side: 'left', mode: 'passive', instrument: 'universal-goniometer', value: { kind: 'angle', angleDeg: 112.5 } },
      { measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', side: 'none', mode: null, instrument: null, value: { kind: 'rating', value: 2 } },
    ]);
    expect(draftConditions(draft({ painNrs: '3', minutesSinceMedication: '' }))).toEqual({ position: null, minutesSinceMedication: null, painNrs: 3 });
  });

  it('names the field of a blank row, and leaves out a row marked "Not tested today"', () => {
    const d = draft({ rows: { mas: [masRow('m1', 'elbow-flexors', null), masRow('m2', 'wrist-flexors', null)], rom: [romRow('r1', '  ')] }, notTested: ['m2'] });
    expect(fields(d)).toEqual(['mas.0.grade', 'rom.0.angleDeg']);
    expect(draftObservations(d).observations).toEqual([]);
  });

  it('names each missing part of a half-filled Tardieu row, and a value that is not a number', () => {
    expect(fields(draft({ rows: { tardieu: [tardieuRow('t1', '20', '', null)] } }))).toEqual(['tardieu.0.r2Deg', 'tardieu.0.quality']);
    expect(fields(draft({ rows: { tardieu: [tardieuRow('t1', '20', 'ten', 1)] } }))).toEqual(['tardieu.0.r2Deg']);
    expect(fields(draft({ rows: { rom: [romRow('r1', '90°')] } }))).toEqual(['rom.0.angleDeg']);
  });

  it("names the value's field when the catalogue refuses it: outside the joint's limits, R1 past R2", () => {
    // 200° knee flexion is beyond any published normal plus the 15° margin (DEVELOPERS.md, measure catalogue).
    expect(fields(draft({ rows: { rom: [romRow('r1', '200')] } }))).toEqual(['rom.0.angleDeg']);
    // R1 (fast catch) cannot exceed R2 (slow passive range): the Tardieu definition (REFERENCES.md).
    expect(fields(draft({ rows: { tardieu: [tardieuRow('t1', '10', '0', 1)] } }))).toEqual(['tardieu.0.r1Deg']);
  });

  it('names a grade that is not on the scale (a draft read back from storage) instead of throwing', () => {
    expect(fields(draft({ rows: { mas: [masRow('m1', 'elbow-flexors', '5')] } }))).toEqual(['mas.0.grade']);
  });

  it('names the second of two rows for the same muscle and side', () => {
    const issues = draftObservations(draft({ rows: { mas: [masRow('m1', 'elbow-flexors', '1'), masRow('m2', 'elbow-flexors', '2')] } })).issues;
    expect(issues.map((i) => i.field)).toEqual(['mas.1']);
    expect(issues[0]!.message).toContain('entered twice');
  });

  it('names pain, minutes since medication and the visit time when they are off', () => {
    expect(fields(draft({ painNrs: '11' }))).toEqual(['painNrs']);
    expect(fields(draft({ painNrs: '2.5' }))).toEqual(['painNrs']);
    expect(fields(draft({ minutesSinceMedication: '-5' }))).toEqual(['minutesSinceMedication']);
    // One week is 10,080 minutes: the form's upper bound.
    expect(fields(draft({ minutesSinceMedication: '10080' }))).toEqual([]);
    expect(fields(draft({ minutesSinceMedication: '10081' }))).toEqual(['minutesSinceMedication']);
    expect(fields(draft({ performedAtLocal: '' }))).toEqual(['performedAtLocal']);
  });

  it('reads a draft kept in the earlier shape (version 1: a field per measure) into rows and ratings by measure code', () => {
    // As the form kept drafts before the catalogue drove it (written by hand in that shape).
    const v1 = { version: 1, patientId: 'p', performedAtLocal: '2026-12-01T09:30', setting: 'home', position: '', minutesSinceMedication: '', painNrs: '', mas: [masRow('m1', 'elbow-flexors', '1+')], tardieu: [], rom: [romRow('r1', '30')], pennFrequency: 2, spasmSeverity: null, notTested: ['r1'] };
    const upgraded = upgradeDraft(v1);
    expect(upgraded?.version).toBe(2);
    expect(upgraded?.rows).toEqual({ mas: [masRow('m1', 'elbow-flexors', '1+')], tardieu: [], rom: [romRow('r1', '30')] });
    expect(upgraded?.ratings).toEqual({ 'penn-spasm-frequency': 2, 'spasm-severity': null });
    expect(upgraded?.notTested).toEqual(['r1']);
    expect(upgraded && 'mas' in upgraded).toBe(false);
    // Not a visit draft, or a shape this version does not know: none.
    expect(upgradeDraft(null)).toBeNull();
    expect(upgradeDraft({ version: 3, patientId: 'p' })).toBeNull();
  });
});
