/**
 * The words of the charts (ProgressChart, PendulumChart, ChangeDistributionChart and the uPlot options
 * beside them), English only for now (see ../../routes/home-messages.ts). The charts load on demand, and
 * so does this catalogue. Messages with numbers are functions; a number arrives already written (its
 * digits are the chart's choice, the words around it the catalogue's).
 */

// Progress chart
export const chartLabel = (title: string) => `Chart: ${title}`;
export const key = 'Key';
export const measured = 'Measured';
export const trend = 'Trend';
export const baseline = 'Baseline';
/** The MDC band's entry in the key, with the MDC in the chart's terms (`step`). */
export const mdcBand = (step: string) => `Baseline ± MDC (${step}): changes inside may be measurement error`;
/** The MDC on an ordinal axis, in grade steps. */
export const gradeSteps = (mdc: number) => `${+mdc.toFixed(2)} ${mdc === 1 ? 'grade step' : 'grade steps'}`;
export const event = 'Event';
export const valuesAsTable = 'Values as a table';
export const date = 'Date';
export const value = 'Value';

// Pendulum chart
export const pendulumLabel = (start: string, firstPeak: string, rest: string) =>
  `Knee angle over time: start ${start}°, first flexion peak ${firstPeak}°, rest ${rest}°`;
export const pendulumCaption =
  'Knee flexion angle from the release (0 s). Plain shading: flexion side of the resting line; hatched: extension side. Diamond: first flexion peak. Dashed lines: starting angle and release.';
export const kneeFlexionAngle = 'Knee flexion angle';
export const fittedSwing = 'Fitted damped swing';
export const restLine = (deg: string) => `rest ${deg}°`;
export const startLine = (deg: string) => `start ${deg}°`;
export const firstPeak = (deg: string) => `first peak ${deg}°`;

// Change distribution (cohort audit)
export const distributionLabel = (title: string) => `Distribution of change: ${title}`;
export const patients = 'Patients';
/** One bar of the histogram: its range of change and how many patients it holds. */
export const changeBin = (from: string, to: string, unit: string, count: number) => `${from} to ${to}${unit}: ${count}`;
