// Public face of src/lib/charts: uPlot wrappers as Svelte components.
export { default as ProgressChart } from './ProgressChart.svelte';
export { type ProgressChartInput } from './progress-chart-options';
export { default as PendulumChart } from './PendulumChart.svelte';
export { type FittedCurve } from './pendulum-chart-options';
export { default as ChangeDistributionChart } from './ChangeDistributionChart.svelte';
