import type { ErrorReference, Measure, MeasureSite, OrdinalGrade } from './measure-types';
import { INSTRUMENTS, ROM_MODES } from './observation';
import { ROM_SITES } from './rom-motions';

/**
 * Muscle groups for the tone scales. Tardieu separates gastrocnemius (knee extended) from soleus
 * (knee flexed) because the test position differs.
 */
const MUSCLE_GROUPS: readonly MeasureSite[] = [
  { code: 'shoulder-adductors', label: 'Shoulder adductors' },
  { code: 'elbow-flexors', label: 'Elbow flexors' },
  { code: 'elbow-extensors', label: 'Elbow extensors' },
  { code: 'forearm-pronators', label: 'Forearm pronators' },
  { code: 'wrist-flexors', label: 'Wrist flexors' },
  { code: 'finger-flexors', label: 'Finger flexors' },
  { code: 'hip-flexors', label: 'Hip flexors' },
  { code: 'hip-adductors', label: 'Hip adductors' },
  { code: 'knee-flexors', label: 'Knee flexors (hamstrings)' },
  { code: 'knee-extensors', label: 'Knee extensors (quadriceps)' },
  { code: 'ankle-plantarflexors', label: 'Ankle plantarflexors' },
];

/**
 * Tardieu angles (R1, R2) are read from the position of minimal stretch of the muscle (its
 * shortest position, 0°), except at the ankle, where 0° is the foot at 90° to the leg and the
 * angle is dorsiflexion, negative short of neutral (convention as recalled from the scale's
 * description, FROM MEMORY: no copy found with the search tool; the NINDS CDE field "Tardieu Scale
 * muscle reaction angle measurement" (cprn.org copy, VERIFIED page) gives degrees of arc but no
 * reference position). At the ankle the limits are those of the ROM row's ankle dorsiflexion, so
 * the two rows accept the same angles for the same joint.
 */
const FROM_SHORTEST = "0° = the muscle's shortest position (minimal stretch); the angle is the range moved from there";
const ANKLE_DORSIFLEXION = ROM_SITES.find((s) => s.code === 'ankle-dorsiflexion');
const ANKLE_TARDIEU = {
  angleReference: '0° = foot at 90° to the leg; positive = dorsiflexion, negative = short of neutral (plantarflexed), as in the range-of-motion row',
  ...(ANKLE_DORSIFLEXION?.limits ? { limits: { ...ANKLE_DORSIFLEXION.limits, basis: `as ROM ankle dorsiflexion: ${ANKLE_DORSIFLEXION.limits.basis}` } } : {}),
};
const TARDIEU_SITES: readonly MeasureSite[] = [
  { code: 'elbow-flexors', label: 'Elbow flexors', angleReference: FROM_SHORTEST },
  { code: 'wrist-flexors', label: 'Wrist flexors', angleReference: FROM_SHORTEST },
  { code: 'finger-flexors', label: 'Finger flexors', angleReference: FROM_SHORTEST },
  { code: 'hip-adductors', label: 'Hip adductors', angleReference: FROM_SHORTEST },
  { code: 'knee-flexors', label: 'Hamstrings', angleReference: FROM_SHORTEST },
  { code: 'knee-extensors', label: 'Rectus femoris / quadriceps', angleReference: FROM_SHORTEST },
  { code: 'ankle-gastrocnemius', label: 'Gastrocnemius (knee extended)', ...ANKLE_TARDIEU },
  { code: 'ankle-soleus', label: 'Soleus (knee flexed)', ...ANKLE_TARDIEU },
];

const WHOLE_PERSON: readonly MeasureSite[] = [{ code: 'whole-body', label: 'Whole body' }];
/** The pendulum test's indices are one panel in overviews. */
const PENDULUM_PANEL = 'Pendulum test';
const KNEE: readonly MeasureSite[] = [{ code: 'knee', label: 'Knee (leg-drop pendulum)' }];

/** Modified Ashworth grades, paraphrased; ranks as REFERENCES.md §9a lists the ordinal codes. */
const MAS_GRADES: readonly OrdinalGrade[] = [
  { label: '0', rank: 0, description: 'Tone not increased' },
  { label: '1', rank: 1, description: 'Slightly raised tone: a catch-and-release, or a little resistance only at the end of the range' },
  { label: '1+', rank: 2, description: 'Slightly raised tone: a catch, then a little resistance through the rest (under half) of the range' },
  { label: '2', rank: 3, description: 'Clearly raised tone through most of the range; the limb still moves easily' },
  { label: '3', rank: 4, description: 'Considerably raised tone; passive movement is difficult' },
  { label: '4', rank: 5, description: 'Limb rigid in flexion or extension' },
];

/** Modified Tardieu quality of muscle reaction, paraphrased from REFERENCES.md §9b. */
const TARDIEU_QUALITY: readonly OrdinalGrade[] = [
  { label: '0', rank: 0, description: 'No resistance through the whole passive movement' },
  { label: '1', rank: 1, description: 'Mild resistance through the movement, no distinct catch' },
  { label: '2', rank: 2, description: 'Distinct catch at a specific angle, then release' },
  { label: '3', rank: 3, description: 'Fatigable clonus (under 10 s) at a specific angle while pressure is held' },
  { label: '4', rank: 4, description: 'Unfatigable clonus (over 10 s) at a specific angle while pressure is held' },
  { label: '5', rank: 5, description: 'Joint cannot be moved' },
];

const ESTABLISH_LOCALLY = 'none: establish locally with a reliability study';

const PENDULUM_NONE: ErrorReference = {
  kind: 'none',
  reason: `${ESTABLISH_LOCALLY}. No SEM or MDC in index units was verified; an IMU study reports test–retest ICC 0.93 (SCI) and 0.87 (controls) for the first swing angle (J NeuroEng Rehabil 2024, 21:50; VERIFIED abstract), which is not an error in units.`,
};

const PENDULUM_DEFINITION =
  'Bajd & Vodovnik 1984, J Biomed Eng 6:9–16 (MEMORY); consistent with Grippo 1997 and Whelan 2018 (VERIFIED wording); REFERENCES.md §7a';

/**
 * The measure catalogue: the one table that drives forms, validation, charts, verdicts and
 * exports. Adding a measure means adding one entry here; its `form` says how the visit form lays it
 * out (a shape the form has: see FormLayout in measure-types.ts).
 */
export const MEASURE_CATALOGUE: readonly Measure[] = [
  {
    code: 'mas',
    label: 'Modified Ashworth Scale',
    description: 'Resistance to passive stretch, graded 0, 1, 1+, 2, 3, 4 per muscle group and side.',
    kind: 'ordinal',
    unit: '{grade}',
    improvement: 'lower',
    sites: MUSCLE_GROUPS,
    lateral: true,
    grades: MAS_GRADES,
    form: { shape: 'grade', heading: 'Modified Ashworth', name: 'Modified Ashworth', siteNoun: 'Muscle group', addLabel: 'Add a muscle group' },
    reference: {
      kind: 'none',
      reason:
        'none: an MDC is not meaningful on an ordinal scale. Published agreement: 86.7 % exact, Kendall τ = .847, elbow flexors (Bohannon & Smith 1987, Phys Ther 67:206–207; VERIFIED abstract); plantarflexors after TBI Spearman 0.73 inter-rater (Allison et al. 1996, Int J Rehabil Res 19:67–78; VERIFIED). Establish local agreement with a reliability study.',
    },
    definitionSource: 'Bohannon RW, Smith MB (1987). Phys Ther 67(2):206–207; grades paraphrased (REFERENCES.md §9a, VERIFIED descriptor tables)',
    caution:
      'Ordinal grades: the rank (0–5) orders grades; steps between grades are not equal. Report medians or counts of grades; a mean of ranks treats the steps as equal and must say so.',
  },
  {
    code: 'tardieu',
    label: 'Modified Tardieu Scale',
    description:
      'R1: angle of catch at the fast (V3) stretch; R2: passive range at the slow (V1) stretch; quality of muscle reaction 0–5; spasticity angle R2 − R1. Angles from the muscle’s shortest position, except at the ankle (0° = foot at 90° to the leg; see each site).',
    kind: 'tardieu',
    unit: 'deg',
    improvement: 'lower',
    componentImprovement: { r1Deg: 'higher', r2Deg: 'higher', quality: 'lower', spasticityAngleDeg: 'lower' },
    sites: TARDIEU_SITES,
    lateral: true,
    angleLimits: { min: 0, max: 180 },
    qualityGrades: TARDIEU_QUALITY,
    form: {
      shape: 'tardieu',
      heading: 'Modified Tardieu',
      name: 'Tardieu',
      siteNoun: 'Muscle group',
      addLabel: 'Add a Tardieu test',
      hint: 'R1: angle of catch at the fast stretch. R2: passive range at the slow stretch. Spasticity angle = R2 − R1.',
    },
    reference: {
      kind: 'none',
      reason: `${ESTABLISH_LOCALLY}. No MDC in degrees was verified for R1, R2 or R2 − R1; Ben-Shabat et al. 2013 (Arch Phys Med Rehabil 94:2494–2501; VERIFIED abstract) report ICC ≈ .79 for R1/R2 with limits of agreement mostly too wide.`,
    },
    definitionSource:
      'Tardieu scale as modified (Boyd & Graham 1999, MEMORY); quality grades per Barnes & Johnson 2008 (REFERENCES.md §9b, VERIFIED pages)',
    caution: 'The fast stretch speed varies between raters (Banky et al. 2019, VERIFIED); keep the same rater and position when comparing.',
  },
  {
    code: 'pendulum-ri',
    panel: { label: PENDULUM_PANEL, shortLabel: 'Relaxation index (R2)' },
    label: 'Pendulum relaxation index (R2)',
    description: 'First swing excursion divided by the excursion from start to rest, A1/A0.',
    kind: 'index',
    unit: '1',
    improvement: 'higher',
    sites: KNEE,
    lateral: true,
    limits: {
      min: 0,
      max: 3,
      basis: 'typical non-spastic ≈ 1.6 (MEMORY) and 1.678 ± 0.090 (Kim et al. 1996, VERIFIED abstract); upper bound 3 is a project choice leaving room for hypotonia',
    },
    integer: false,
    modes: null,
    instruments: null,
    reference: PENDULUM_NONE,
    definitionSource: PENDULUM_DEFINITION,
    caution: 'Higher is better up to the non-spastic level (≈ 1.6); well above it may mean hypotonia.',
  },
  {
    code: 'pendulum-ri-normalised',
    panel: { label: PENDULUM_PANEL, shortLabel: 'Normalised relaxation index (R2n)' },
    label: 'Pendulum normalised relaxation index (R2n)',
    description: 'Relaxation index divided by 1.6, so a typical non-spastic knee scores about 1.',
    kind: 'index',
    unit: '1',
    improvement: 'higher',
    sites: KNEE,
    lateral: true,
    limits: { min: 0, max: 2, basis: 'R2 limit 3 / 1.6, rounded up (project choice)' },
    integer: false,
    modes: null,
    instruments: null,
    reference: PENDULUM_NONE,
    definitionSource: `${PENDULUM_DEFINITION}; divisor 1.6 (MEMORY)`,
    caution: null,
  },
  {
    code: 'pendulum-first-swing',
    panel: { label: PENDULUM_PANEL, shortLabel: 'First swing excursion (A1)' },
    label: 'Pendulum first swing excursion (A1)',
    description: 'Angle swept from release to the first reversal of the first swing.',
    kind: 'angle',
    unit: 'deg',
    improvement: 'higher',
    sites: KNEE,
    lateral: true,
    limits: { min: 0, max: 180, basis: 'cannot exceed a half turn (physical bound)' },
    integer: false,
    modes: null,
    instruments: null,
    reference: PENDULUM_NONE,
    definitionSource: `${PENDULUM_DEFINITION}; first flexion amplitude per Valle et al. 2006 (VERIFIED)`,
    caution: null,
  },
  {
    code: 'pendulum-resting-angle',
    panel: { label: PENDULUM_PANEL, shortLabel: 'Resting angle' },
    label: 'Pendulum resting angle',
    description: 'Knee flexion angle at rest once the swings die out (0° = full extension).',
    kind: 'angle',
    unit: 'deg',
    improvement: 'none',
    sites: KNEE,
    lateral: true,
    limits: { min: 0, max: 155, basis: 'knee flexion widest normal 140° + 15° margin (see ROM limits)' },
    integer: false,
    modes: null,
    instruments: null,
    reference: PENDULUM_NONE,
    definitionSource: `${PENDULUM_DEFINITION}; plateau angle per Whelan 2018 (VERIFIED)`,
    caution: 'Depends on seating and thigh support; compare only like with like.',
  },
  {
    code: 'pendulum-swing-count',
    panel: { label: PENDULUM_PANEL, shortLabel: 'Number of swings' },
    label: 'Pendulum number of swings',
    description: 'Number of oscillations before the leg comes to rest.',
    kind: 'count',
    unit: '{swings}',
    improvement: 'higher',
    sites: KNEE,
    lateral: true,
    limits: { min: 0, max: 30, basis: 'a typical healthy trace shows 8 (VERIFIED figure caption, REFERENCES.md §7a); 30 is a project choice' },
    integer: true,
    modes: null,
    instruments: null,
    reference: PENDULUM_NONE,
    definitionSource: 'Grippo et al. 1997, Europa Medicophysica (VERIFIED wording)',
    caution: null,
  },
  {
    code: 'rom',
    label: 'Range of motion (goniometry)',
    description: 'End-of-range joint angle for one motion, active or passive, with the instrument used.',
    kind: 'angle',
    unit: 'deg',
    improvement: 'higher',
    sites: ROM_SITES,
    lateral: true,
    limits: { min: -180, max: 180, basis: 'per motion: see each site' },
    integer: false,
    modes: ROM_MODES,
    instruments: INSTRUMENTS,
    form: { shape: 'angle', heading: 'Range of motion', name: 'Range of motion', siteNoun: 'Joint motion', addLabel: 'Add a joint motion', defaultMode: 'passive', defaultInstrument: 'universal-goniometer' },
    reference: { kind: 'none', reason: ESTABLISH_LOCALLY },
    definitionSource: 'Neutral-zero method (COMMON PRACTICE); normal ranges REFERENCES.md §10a',
    caution: 'Published error figures hold for their own instrument, raters and population; a local study is better.',
  },
  {
    code: 'penn-spasm-frequency',
    label: 'Penn Spasm Frequency Scale',
    description: '0 no spasms; 1 only when provoked; 2 under one per hour; 3 more than once an hour; 4 more than ten an hour.',
    kind: 'rating',
    unit: '{score}',
    improvement: 'lower',
    sites: WHOLE_PERSON,
    lateral: false,
    limits: { min: 0, max: 4, basis: 'scale definition (REFERENCES.md §9c, VERIFIED NINDS CDE page)' },
    integer: true,
    modes: null,
    instruments: null,
    reference: {
      kind: 'none',
      reason: `${ESTABLISH_LOCALLY}. SEM/MDC not established (NINDS CDE); test–retest ICC 0.91 in chronic SCI (Adams et al. 2007; VERIFIED secondary).`,
    },
    definitionSource: 'Penn RD et al. (1989). N Engl J Med 320:1517–1521 (citation from MEMORY); grades VERIFIED (NINDS CDE page)',
    caution: 'Ordinal frequency bands; report medians.',
    form: { shape: 'rating', section: 'Spasms', name: 'Penn spasm frequency' },
  },
  {
    code: 'spasm-severity',
    label: 'Spasm severity (0–10 rating)',
    description: 'Patient-rated severity of spasms, 0 none to 10 worst imaginable.',
    kind: 'rating',
    unit: '{score}',
    improvement: 'lower',
    sites: WHOLE_PERSON,
    lateral: false,
    limits: { min: 0, max: 10, basis: '0–10 numeric rating (COMMON PRACTICE)' },
    integer: true,
    modes: null,
    instruments: null,
    reference: { kind: 'none', reason: ESTABLISH_LOCALLY },
    definitionSource: '0–10 numeric rating scale (COMMON PRACTICE); not the 1–3 severity part of the Penn scale',
    caution: null,
    form: { shape: 'rating', section: 'Spasms', name: 'Spasm severity' },
  },
];

const BY_CODE: ReadonlyMap<string, Measure> = new Map(MEASURE_CATALOGUE.map((m) => [m.code, m]));

/** The catalogue entry for `code`, or undefined. */
export function findMeasure(code: string): Measure | undefined {
  return BY_CODE.get(code);
}

/** The site of `measure` with `siteCode`, or undefined. */
export function findSite(measure: Measure, siteCode: string): MeasureSite | undefined {
  return measure.sites.find((s) => s.code === siteCode);
}
