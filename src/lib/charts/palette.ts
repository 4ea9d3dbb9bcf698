// Kinnote's chart palette. Chosen so that every pair stays distinguishable with the common colour-vision
// deficiencies (blue/orange/purple families differ in lightness as well as hue), and every series also has a
// second cue: marker shape or dash pattern. Text colours meet WCAG AA on white.
export const chartColours = {
  value: '#1f4e5a',
  valueFill: '#1f4e5a',
  trend: '#b35806',
  baseline: '#3d3d3d',
  band: 'rgba(91, 155, 184, 0.22)',
  bandEdge: 'rgba(31, 78, 90, 0.55)',
  event: '#5e3c99',
  rest: '#3d3d3d',
  fit: '#b35806',
  flexionArea: 'rgba(91, 155, 184, 0.35)',
  extensionArea: 'rgba(179, 88, 6, 0.28)',
  grid: 'rgba(0, 0, 0, 0.09)',
  axis: '#33434a',
} as const;

/** The font of the words drawn on a chart's canvas (a CSS font-family list). */
export const chartFontFamily = 'system-ui,sans-serif';

export const chartDashes = {
  trend: [10, 6],
  baseline: [2, 4],
  event: [4, 4],
  fit: [8, 5],
  mdcEdge: [1, 3],
} as const;
