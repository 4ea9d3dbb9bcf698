/**
 * The words of the measuring instruments (pendulum test from a file or with the phone, phone
 * inclinometer), of their pages under /measure, and of a saved swing shown again, in one typed
 * catalogue like the programme's (ui/programme/therapist-messages.ts). English only for now; messages
 * with values are functions. Clinical cautions are here too: change them with a clinician.
 */

/** A run of a hint: plain words, or a name to show as code (a CSV column). */
export type HintPart = { readonly text: string } | { readonly code: string };

export const INSTRUMENT_MESSAGES = {
  // Shared by the instruments
  saving: 'Saving…',
  saveToRecord: 'Save to the record',
  backToPatient: 'Back to the patient',
  chooseKnee: 'Choose which knee was tested.',
  whichKnee: 'Which knee was tested?',
  left: 'Left',
  right: 'Right',
  motionProblemDetail: (problem: string, detail: string | null) => `${problem}${detail ? ` (${detail})` : ''}`,
  savedExcept: (skipped: string) => `Saved with the trace, except (outside what the record accepts): ${skipped}.`,
  // The pages under /measure
  inclinometerPageTitle: 'Phone inclinometer · Kinnote',
  inclinometerHeading: 'Phone inclinometer',
  inclinometerFromVisit: "To add the reading to today's visit, start it from the visit form instead.",
  pendulumPhonePageTitle: 'Pendulum test with the phone · Kinnote',
  pendulumPhoneHeading: 'Pendulum test with the phone',
  recordingFor: 'Recording for patient record',
  orFromVisit: ". To add it to today's visit, start it from the visit form instead.",
  // The patient's pendulum page: from a file, or a saved swing shown again
  pendulumPageTitle: 'Pendulum test · Kinnote',
  pendulumCrumb: 'Pendulum test',
  pendulumFromRecording: 'Pendulum test from a recording',
  pendulumFromVisit: "To add it to today's visit, start it from the visit form instead.",
  recordedSwing: (when: string | null) => `Recorded swing${when ? ` of ${when}` : ''}`,
  readingRecording: 'Reading the recording…',
  analysedAgain: 'The swing as recorded, analysed again',
  analysedAgainNote: "The indices above come from today's analysis of the stored samples; the values saved with the visit are in the patient's overview.",
  noSuchSwing: 'No recorded swing with this id for this patient on this device.',
  swingLabel: (when: string) => `recorded swing of ${when}`,
  swingUnreadable: (why: string) => `This recording cannot be shown: ${why}`,
  // Cautions before a pendulum test
  pendulumCautionsTitle: 'Before a pendulum test',
  pendulumCautionKnee: 'Not on a painful, unstable, swollen or recently injured or operated knee.',
  pendulumCautionSeat: 'Seat the person securely with the thigh supported; support and guard the leg throughout, ready to stop it.',
  pendulumCautionStrap: 'Strap the phone on firmly so it cannot slip or fall during the swing.',
  pendulumCautionRelax: 'Ask them to relax and not to help or stop the swing; stop at once if the person feels pain or asks to stop.',
  pendulumCautionProtocol:
    "Follow your local protocol. Kinnote is not a diagnostic device; the numbers support a clinician's judgement, and decisions rest with licensed clinicians.",
  // Pendulum from a file
  recordingFile: 'Recording file',
  fileFormat: [
    { text: 'CSV with a header: ' },
    { code: 'time_s' },
    { text: ' or ' },
    { code: 'time_ms' },
    { text: '; ' },
    { code: 'angle_deg' },
    { text: ', ' },
    { code: 'angle_rad' },
    { text: ' or ' },
    { code: 'gyro_dps' },
    { text: '; optional ' },
    { code: 'emg_uv' },
    { text: '. Knee flexion angle: 0° = straight.' },
  ] as readonly HintPart[],
  chooseRecording: 'Choose a recording',
  analysing: (fileName: string) => `Analysing ${fileName}…`,
  cannotAnalyse: (why: string) => `This recording cannot be analysed: ${why}`,
  resultsOf: (fileName: string) => `Results: ${fileName}`,
  pendulumFromFile: 'Pendulum from a file',
  pendulumWithPhone: 'Pendulum with the phone',
  /** The line naming a pendulum reading in a visit: "Pendulum from a file, left knee: R2 1.32, resting angle 61.0°". */
  pendulumTitle: (instrument: string, side: string, r2: string, restingDeg: string) => `${instrument}, ${side} knee: R2 ${r2}, resting angle ${restingDeg}°`,
  // One pendulum result
  checkFirst: 'Check before relying on these numbers',
  noSingleIndex: 'No single index grades a leg: read R2 together with the resting angle, the side areas and the damping.',
  notAvailable: '–',
  didNotConverge: 'did not converge',
  /** The indices after a pendulum test, each with a one-line definition in plain words. */
  indices: {
    relaxationIndex: { label: 'Relaxation index R2', definition: 'First swing (A1) divided by the drop from start to rest (A0); about 1.6 in relaxed legs, lower when the swing is caught.' },
    normalizedRelaxationIndex: { label: 'Normalised R2', definition: 'R2 / 1.6, so that about 1 is typical of a relaxed leg.' },
    startAngle: { label: 'Starting angle', definition: 'Knee flexion where the leg was held before release (0° = straight).' },
    restAngle: { label: 'Resting angle', definition: 'Where the leg finally settles, from the last still stretch of the recording.' },
    firstPeak: { label: 'First flexion peak', definition: 'Furthest the knee bends on the first downswing, and when, after release.' },
    a0: { label: 'A0', definition: 'Resting minus starting angle: how far gravity takes the leg in the end.' },
    a1: { label: 'A1 (first swing excursion)', definition: 'First flexion peak minus starting angle: how far the first swing actually goes.' },
    swingCount: { label: 'Swings past rest', definition: 'Flexion peaks that pass the resting angle by more than 1°.' },
    firstPeriod: { label: 'First period', definition: 'Time between the first two flexion peaks.' },
    peakFlexionSpeed: { label: 'Peak flexion speed', definition: 'Fastest knee bending during the first downswing.' },
    flexionArea: { label: 'Flexion-side area', definition: 'Area between the curve and the resting line while the knee is bent past rest.' },
    extensionArea: { label: 'Extension-side area', definition: 'Area between the curve and the resting line while the knee is straighter than rest.' },
    dominantSide: { label: 'Dominant side', definition: 'Which side holds more area: hints at a flexor- or extensor-type pattern.' },
    dampedFit: { label: 'Damped fit', definition: 'Best damped oscillation through the swing: τ is how fast it dies out, ω how fast it swings.' },
    sampleRate: { label: 'Sample rate', definition: 'Uniform rate the recording was resampled to.' },
  },
  peakAt: (angle: string, seconds: string) => `${angle} at ${seconds} s`,
  sampleRateHz: (hz: string) => `${hz} Hz`,
  // Pendulum with the phone
  setupTitle: 'Set-up',
  setupSteps: [
    'Seat the person on a high couch with the thigh supported and level, the lower leg hanging free.',
    'Strap the phone to the front or the outer side of the shin, about halfway between knee and ankle, its long edge along the shin bone (upright, upside down or sideways). A phone tilted on the shin shifts the start and resting angles by as much, not A0, A1 or R2.',
    'Lift the leg until the knee is straight and hold it still there.',
    'Tap Start and keep holding through the countdown, then let go. Do not push the leg.',
    'The recording stops by itself once the leg has hung still for 2 seconds.',
  ] as readonly string[],
  recordingTitle: 'Recording',
  recordAgain: 'Record again',
  start: 'Start',
  stop: 'Stop',
  countdown: (seconds: number) => `Hold the leg straight and still… release in ${seconds} s`,
  letGo: 'Recording: let go of the leg now.',
  stopped: (samples: number) => `Stopped: ${samples} samples recorded.`,
  liveAngle: 'Live knee angle',
  samples: (n: number) => `${n} samples`,
  resultTitle: 'Result',
  notAnalysed: (why: string) => `The recording could not be analysed: ${why}`,
  exportRaw: 'Export raw recording (CSV)',
  openFromPatient: "To save the result, open this page from a patient's record.",
  thisRecording: 'this recording',
  // The phone inclinometer
  cautionsTitle: 'Cautions',
  inclinometerCaution:
    'Move the joint only as far as is comfortable and as your local protocol allows; stop if the person feels pain. Kinnote is not a diagnostic device; decisions rest with licensed clinicians.',
  howTitle: 'How to measure',
  howSteps: [
    'Tap "Start sensors".',
    'Lay the phone flat along the moving segment (for example the shin), long edge along the bone, and keep it there.',
    'In the start position, hold still until it says "steady", then tap "Set zero".',
    'Move the joint to the end position, hold still until "steady", then tap "Measure end position".',
  ] as readonly string[],
  howHint: "The joint angle is the turn between the two positions; the segment angle is the phone's long edge against the vertical.",
  readingTitle: 'Reading',
  startSensors: 'Start sensors',
  steady: 'Steady',
  holdStill: (reason: string | null) => `Hold still${reason ? `: ${reason}` : ''}`,
  jointAngle: 'Joint angle',
  jointAngleLabel: 'Joint angle (zero to end position)',
  segmentToVertical: 'Segment to vertical:',
  setZero: 'Set zero',
  measureEnd: 'Measure end position',
  notSteadyAtZero: 'Hold the phone still against the segment until it says "steady", then try again.',
  zeroSet: 'Zero set. Now move the joint to the end position, hold the phone still there and tap "Measure end position".',
  notSteadyAtEnd: 'Hold the phone still in the end position until it says "steady", then try again.',
  angleMeasured: 'Joint angle measured (average of the last second in each position).',
  saveAsRom: 'Save as range of motion',
  motion: 'Motion',
  side: 'Side',
  chooseSide: 'Choose the side before saving.',
  movement: 'Movement',
  passive: 'Passive',
  active: 'Active',
  /** The line naming an inclinometer reading in a visit: "Inclinometer, left knee flexion (passive): 42.5°". */
  inclinometerTitle: (side: string, site: string, mode: string, angleDeg: string) => `Inclinometer, ${side} ${site.toLowerCase()} (${mode}): ${angleDeg}°`,
};

export type InstrumentMessages = typeof INSTRUMENT_MESSAGES;
