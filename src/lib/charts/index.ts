// Public face of src/lib/charts: uPlot wrappers as Svelte components.
export { default as UPlotChart } from './UPlotChart.svelte';
export { default as ProgressChart } from './ProgressChart.svelte';
export { progressChartData, progressChartOptions, type ProgressChartInput } from './progress-chart-options';
export { chartColours, chartDashes } from './palette';
export { default as PendulumChart } from './PendulumChart.svelte';
export { pendulumChartData, pendulumChartOptions, type FittedCurve } from './pendulum-chart-options';
export { minMaxDecimate } from './min-max-decimate';
export { default as ChangeDistributionChart } from './ChangeDistributionChart.svelte';
export { changeHistogram, changeDistributionOptions, type ChangeDistributionInput } from './change-distribution-options';
