import type { ValidationIssue } from './domain-error';
import { findMeasure, findSite } from './measure-catalogue';
import type { Observation } from './observation';

/**
 * Checks an observation against its catalogue entry: known measure and site, side given exactly
 * when the measure is lateral, value kind matching the measure kind, values within the site's or
 * measure's limits, grade label and rank agreeing, R1 ≤ R2 and spasticity angle = R2 − R1 (to
 * 1e-9 °), ROM mode and instrument present (and absent elsewhere). Returns the issues (empty when
 * valid); never throws. Assumes the record already passed ObservationSchema.
 */
export function checkObservation(obs: Observation): ValidationIssue[] {
  const issues: ValidationIssue[] = [];
  const measure = findMeasure(obs.measureCode);
  if (!measure) return [{ path: 'measureCode', message: `unknown measure "${obs.measureCode}"` }];
  const site = findSite(measure, obs.siteCode);
  if (!site) issues.push({ path: 'siteCode', message: `"${obs.siteCode}" is not a site of ${measure.code}` });
  if (measure.lateral && obs.side === 'none') issues.push({ path: 'side', message: `${measure.code} needs left or right` });
  if (!measure.lateral && obs.side !== 'none') issues.push({ path: 'side', message: `${measure.code} takes no side; use "none"` });

  const wantsMode = measure.kind !== 'ordinal' && measure.kind !== 'tardieu' && measure.modes !== null;
  if (wantsMode && obs.mode === null) issues.push({ path: 'mode', message: 'say active or passive' });
  if (!wantsMode && obs.mode !== null) issues.push({ path: 'mode', message: `${measure.code} takes no mode` });
  const wantsInstrument = measure.kind !== 'ordinal' && measure.kind !== 'tardieu' && measure.instruments !== null;
  if (wantsInstrument && obs.instrument === null) issues.push({ path: 'instrument', message: 'say which instrument' });
  if (!wantsInstrument && obs.instrument !== null) issues.push({ path: 'instrument', message: `${measure.code} takes no instrument` });

  const value = obs.value;
  if (value.kind !== measure.kind) {
    issues.push({ path: 'value.kind', message: `${measure.code} holds "${measure.kind}" values, not "${value.kind}"` });
    return issues;
  }
  const inRange = (path: string, x: number, lo: number, hi: number, what: string) => {
    if (!(x >= lo && x <= hi)) issues.push({ path, message: `${x} is outside ${lo}..${hi} ${what}` });
  };
  switch (measure.kind) {
    case 'ordinal': {
      if (value.kind !== 'ordinal') break;
      const grade = measure.grades.find((g) => g.label === value.grade);
      if (!grade) issues.push({ path: 'value.grade', message: `"${value.grade}" is not a grade (${measure.grades.map((g) => g.label).join(', ')})` });
      else if (grade.rank !== value.rank) issues.push({ path: 'value.rank', message: `grade ${grade.label} has rank ${grade.rank}, not ${value.rank}` });
      break;
    }
    case 'tardieu': {
      if (value.kind !== 'tardieu') break;
      // Per site where the site has its own limits (the ankle: those of ROM ankle dorsiflexion).
      const { min, max } = site?.limits ?? measure.angleLimits;
      const unit = site?.limits ? `deg at the ${site.label.toLowerCase()} (${site.angleReference ?? 'see the site'})` : 'deg';
      inRange('value.r1Deg', value.r1Deg, min, max, unit);
      inRange('value.r2Deg', value.r2Deg, min, max, unit);
      if (value.r1Deg > value.r2Deg) issues.push({ path: 'value.r1Deg', message: 'R1 (fast catch) cannot exceed R2 (slow passive range)' });
      if (!measure.qualityGrades.some((g) => g.rank === value.quality)) issues.push({ path: 'value.quality', message: `${value.quality} is not a quality grade 0–5` });
      if (Math.abs(value.spasticityAngleDeg - (value.r2Deg - value.r1Deg)) > 1e-9) {
        issues.push({ path: 'value.spasticityAngleDeg', message: `must equal R2 − R1 = ${value.r2Deg - value.r1Deg}` });
      }
      break;
    }
    default: {
      const limits = site?.limits ?? measure.limits;
      const x = value.kind === 'angle' ? value.angleDeg : value.kind === 'ordinal' || value.kind === 'tardieu' ? NaN : value.value;
      const path = value.kind === 'angle' ? 'value.angleDeg' : 'value.value';
      inRange(path, x, limits.min, limits.max, `${measure.unit} for ${site?.code ?? measure.code}`);
      if (measure.integer && !Number.isInteger(x)) issues.push({ path, message: 'must be a whole number' });
    }
  }
  return issues;
}

/** Builds a Modified Tardieu value with its derived spasticity angle R2 − R1. */
export function tardieuValue(r1Deg: number, r2Deg: number, quality: number) {
  return { kind: 'tardieu' as const, r1Deg, r2Deg, quality, spasticityAngleDeg: r2Deg - r1Deg };
}

/** Builds an ordinal value from a grade label of `measureCode`; throws RangeError for an unknown grade. */
export function ordinalValue(measureCode: string, grade: string) {
  const measure = findMeasure(measureCode);
  if (!measure || measure.kind !== 'ordinal') throw new RangeError(`${measureCode} is not an ordinal measure`);
  const found = measure.grades.find((g) => g.label === grade);
  if (!found) throw new RangeError(`"${grade}" is not a grade of ${measureCode}`);
  return { kind: 'ordinal' as const, grade: found.label, rank: found.rank };
}
