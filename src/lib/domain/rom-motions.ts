import type { ErrorReference, EvidenceStatus, MeasureSite } from './measure-types';

/**
 * Hypermobility margin added above the widest published normal range. Project choice, no source:
 * the Beighton score counts elbow and knee hyperextension beyond 10° (from memory); 15° covers that
 * with room, and anything further is far more likely a typing slip than a joint.
 */
export const HYPERMOBILITY_MARGIN_DEG = 15;

interface MotionRow {
  readonly code: string;
  readonly label: string;
  /** Widest end of range among the published normal sets in REFERENCES.md §10a. */
  readonly widestNormalDeg: number;
  /** Which sets gave which value, with their REFERENCES.md status. */
  readonly normalBasis: string;
  /** Motion in the opposite direction in the same plane, whose range bounds this one below 0°. */
  readonly opposite: string | null;
  readonly reference?: ErrorReference;
  /** Where 0° is, where the motion's neutral needs saying (shown beside the angle field). */
  readonly zero?: string;
}

/** The ankle's neutral, for both its motions (Tardieu's ankle sites use the same, see the catalogue). */
const ANKLE_ZERO = '0° = foot at 90° to the leg';

const AAOS = 'AAOS 1965 via Norkin & White (MEMORY, not verified in a copy)';
const MERCK = 'Merck Manual table (VERIFIED copy)';
const VA = 'US VA schedule 38 CFR §4.71a (VERIFIED page; attribution from MEMORY)';

const ARMSTRONG = 'Armstrong AD, MacDermid JC, Chinchalkar S, Stevens RS, King GJW (1998). J Shoulder Elbow Surg 7:573–580';
const HANCOCK = 'Hancock GE et al. (2018). J Exp Orthop (PMC6195503)';
const HAYES = 'Hayes K et al. (2001). Aust J Physiother 47:289–294';
const ACL_2024 = '"Inclinometers and Apps Are Better than Goniometers…" (Thieme 2024), doi:10.1055/a-2321-0516';

function armstrong(same: number, different: number, status: EvidenceStatus = 'VERIFIED (abstract)'): ErrorReference {
  return {
    kind: 'published',
    figures: [
      { statistic: 'change-for-95-percent-confidence', low: same, high: same, raters: 'same-rater', instrument: 'universal-goniometer', population: 'elbows and forearms (mixed patients and volunteers)', source: ARMSTRONG, status },
      { statistic: 'change-for-95-percent-confidence', low: different, high: different, raters: 'different-raters', instrument: 'universal-goniometer', population: 'elbows and forearms (mixed patients and volunteers)', source: ARMSTRONG, status },
    ],
  };
}

const KNEE: ErrorReference = {
  kind: 'published',
  figures: [
    { statistic: 'minimum-significant-difference', low: 6, high: 6, raters: 'unspecified', instrument: 'inclinometer', population: 'knee angle', source: HANCOCK, status: 'VERIFIED (abstract; first author from MEMORY)' },
    { statistic: 'minimum-significant-difference', low: 10, high: 10, raters: 'unspecified', instrument: 'universal-goniometer', population: 'knee angle, long-arm goniometer', source: HANCOCK, status: 'VERIFIED (abstract; first author from MEMORY)' },
    { statistic: 'minimum-significant-difference', low: 12, high: 12, raters: 'unspecified', instrument: 'phone-sensor', population: 'knee angle, smartphone app', source: HANCOCK, status: 'VERIFIED (abstract; first author from MEMORY)' },
  ],
};

const KNEE_EXTENSION: ErrorReference = {
  kind: 'published',
  figures: [
    ...(KNEE.kind === 'published' ? KNEE.figures : []),
    { statistic: 'MDC95', low: 2.0, high: 3.5, raters: 'same-rater', instrument: null, population: 'knee extension after ACL injury (goniometer, inclinometer, app)', source: ACL_2024, status: 'VERIFIED (abstract; author list not retrieved)' },
    { statistic: 'MDC95', low: 3.7, high: 10.4, raters: 'different-raters', instrument: null, population: 'knee extension after ACL injury (goniometer, inclinometer, app)', source: ACL_2024, status: 'VERIFIED (abstract; author list not retrieved)' },
  ],
};

const SHOULDER: ErrorReference = {
  kind: 'published',
  figures: [
    { statistic: 'SEM', low: 11, high: 23, raters: 'same-rater', instrument: null, population: 'symptomatic shoulders', source: HAYES, status: 'VERIFIED' },
    { statistic: 'SEM', low: 14, high: 25, raters: 'different-raters', instrument: null, population: 'symptomatic shoulders', source: HAYES, status: 'VERIFIED' },
  ],
};

/** Joint motions measured by goniometry, with their physiological limits and error references. */
const MOTIONS: readonly MotionRow[] = [
  { code: 'hip-flexion', label: 'Hip flexion', widestNormalDeg: 125, normalBasis: `120 ${AAOS}; 125 ${MERCK}; 125 ${VA}`, opposite: 'hip-extension' },
  { code: 'hip-extension', label: 'Hip extension', widestNormalDeg: 30, normalBasis: `30 ${AAOS}; 15 ${MERCK}; 30 ${VA}`, opposite: 'hip-flexion' },
  { code: 'hip-abduction', label: 'Hip abduction', widestNormalDeg: 45, normalBasis: `45 ${AAOS}; 45 ${MERCK}; 45 ${VA}`, opposite: 'hip-adduction' },
  { code: 'hip-adduction', label: 'Hip adduction', widestNormalDeg: 45, normalBasis: `30 ${AAOS}; 45 ${MERCK}; 25 ${VA}`, opposite: 'hip-abduction' },
  { code: 'hip-internal-rotation', label: 'Hip internal rotation', widestNormalDeg: 45, normalBasis: `45 ${AAOS}`, opposite: 'hip-external-rotation' },
  { code: 'hip-external-rotation', label: 'Hip external rotation', widestNormalDeg: 45, normalBasis: `45 ${AAOS}`, opposite: 'hip-internal-rotation' },
  { code: 'knee-flexion', label: 'Knee flexion', widestNormalDeg: 140, normalBasis: `135 ${AAOS}; 130 ${MERCK}; 140 ${VA}`, opposite: 'knee-extension', reference: KNEE },
  { code: 'knee-extension', label: 'Knee extension (0 = full extension, negative = extension deficit)', widestNormalDeg: 0, normalBasis: '0 = full extension (COMMON PRACTICE)', opposite: 'knee-flexion', reference: KNEE_EXTENSION },
  { code: 'ankle-dorsiflexion', label: 'Ankle dorsiflexion', widestNormalDeg: 20, normalBasis: `20 ${AAOS}; 20 ${MERCK}; 20 ${VA}`, opposite: 'ankle-plantarflexion', zero: ANKLE_ZERO },
  { code: 'ankle-plantarflexion', label: 'Ankle plantarflexion', widestNormalDeg: 50, normalBasis: `50 ${AAOS}; 50 ${MERCK}; 45 ${VA}`, opposite: 'ankle-dorsiflexion', zero: ANKLE_ZERO },
  { code: 'shoulder-flexion', label: 'Shoulder flexion', widestNormalDeg: 180, normalBasis: `180 ${AAOS}; 180 ${VA} (the Merck "to 90°" item is a different test)`, opposite: 'shoulder-extension', reference: SHOULDER },
  { code: 'shoulder-extension', label: 'Shoulder extension', widestNormalDeg: 60, normalBasis: `60 ${AAOS}`, opposite: 'shoulder-flexion', reference: SHOULDER },
  { code: 'shoulder-abduction', label: 'Shoulder abduction', widestNormalDeg: 180, normalBasis: `180 ${AAOS}`, opposite: null, reference: SHOULDER },
  { code: 'shoulder-internal-rotation', label: 'Shoulder internal rotation', widestNormalDeg: 70, normalBasis: `70 ${AAOS}`, opposite: 'shoulder-external-rotation', reference: SHOULDER },
  { code: 'shoulder-external-rotation', label: 'Shoulder external rotation', widestNormalDeg: 90, normalBasis: `90 ${AAOS}`, opposite: 'shoulder-internal-rotation', reference: SHOULDER },
  { code: 'elbow-flexion', label: 'Elbow flexion', widestNormalDeg: 160, normalBasis: `150 ${AAOS}; 160 ${MERCK}; 145 ${VA}`, opposite: 'elbow-extension', reference: armstrong(6, 10) },
  { code: 'elbow-extension', label: 'Elbow extension (0 = full extension, negative = extension deficit)', widestNormalDeg: 0, normalBasis: '0 = full extension (COMMON PRACTICE)', opposite: 'elbow-flexion', reference: armstrong(7, 10) },
  { code: 'forearm-pronation', label: 'Forearm pronation', widestNormalDeg: 90, normalBasis: `80 ${AAOS}; 90 ${MERCK}; 80 ${VA}`, opposite: 'forearm-supination', reference: armstrong(8, 10, 'VERIFIED (two abstract copies)') },
  { code: 'forearm-supination', label: 'Forearm supination', widestNormalDeg: 90, normalBasis: `80 ${AAOS}; 90 ${MERCK}; 85 ${VA}`, opposite: 'forearm-pronation', reference: armstrong(8, 11, 'VERIFIED (two abstract copies)') },
  { code: 'wrist-flexion', label: 'Wrist flexion', widestNormalDeg: 90, normalBasis: `80 ${AAOS}; 90 ${MERCK}; 80 ${VA}`, opposite: 'wrist-extension' },
  { code: 'wrist-extension', label: 'Wrist extension', widestNormalDeg: 70, normalBasis: `70 ${AAOS}; 70 ${MERCK}; 70 ${VA}`, opposite: 'wrist-flexion' },
  { code: 'wrist-radial-deviation', label: 'Wrist radial deviation', widestNormalDeg: 25, normalBasis: `20 ${AAOS}; 25 ${MERCK}; 20 ${VA}`, opposite: 'wrist-ulnar-deviation' },
  { code: 'wrist-ulnar-deviation', label: 'Wrist ulnar deviation', widestNormalDeg: 65, normalBasis: `30 ${AAOS}; 65 ${MERCK}; 45 ${VA}`, opposite: 'wrist-radial-deviation' },
  { code: 'finger-mcp-flexion', label: 'Finger MCP flexion', widestNormalDeg: 90, normalBasis: '90 AAOS (MEMORY; not in REFERENCES.md)', opposite: 'finger-mcp-extension' },
  { code: 'finger-mcp-extension', label: 'Finger MCP extension (hyperextension)', widestNormalDeg: 45, normalBasis: '45 AAOS (MEMORY; not in REFERENCES.md)', opposite: 'finger-mcp-flexion' },
  { code: 'finger-pip-flexion', label: 'Finger PIP flexion', widestNormalDeg: 100, normalBasis: '100 AAOS (MEMORY; not in REFERENCES.md)', opposite: null },
  { code: 'finger-dip-flexion', label: 'Finger DIP flexion', widestNormalDeg: 90, normalBasis: '90 AAOS (MEMORY; not in REFERENCES.md)', opposite: null },
];

/**
 * ROM sites with validation limits derived by one rule, so no limit is typed by hand:
 * max = widest published normal + HYPERMOBILITY_MARGIN_DEG; min = −(max of the opposite motion),
 * because a contracture can stop a joint anywhere on the far side of neutral (e.g. a fixed equinus
 * reads as negative dorsiflexion); min = −margin where there is no opposite motion.
 */
export const ROM_SITES: readonly MeasureSite[] = MOTIONS.map((row) => {
  const opposite = row.opposite === null ? undefined : MOTIONS.find((m) => m.code === row.opposite);
  const max = row.widestNormalDeg + HYPERMOBILITY_MARGIN_DEG;
  const min = opposite ? -(opposite.widestNormalDeg + HYPERMOBILITY_MARGIN_DEG) : -HYPERMOBILITY_MARGIN_DEG;
  const site: MeasureSite = {
    code: row.code,
    label: row.label,
    limits: {
      min,
      max,
      basis: `widest normal ${row.widestNormalDeg}° (${row.normalBasis}) + ${HYPERMOBILITY_MARGIN_DEG}° hypermobility margin; below 0° down to the opposite motion's limit`,
    },
    ...(row.reference ? { reference: row.reference } : {}),
    ...(row.zero ? { angleReference: row.zero } : {}),
  };
  return site;
});
