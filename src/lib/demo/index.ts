// Public face of src/lib/demo: other folders import only this file.
// Pure and seeded: the same options always give the same invented caseload.
export { SeededRandom } from './seeded-random';
export { DEMO_FICTION_NOTICE } from './demo-people';
export {
  DEMO_DEFAULT_END_DATE,
  generateDemoScenario,
  type DemoOptions,
  type DemoScenario,
  type DemoTables,
} from './generate-demo-scenario';
export { DEMO_DRAWN_EXERCISE, calfStretchDrawing, type DrawingShape, type LineDrawing } from './demo-drawing';
