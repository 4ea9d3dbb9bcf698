// Public face of src/lib/demo: other folders import only this file.
// Pure and seeded: the same options always give the same invented caseload.
export {
  DEMO_DEFAULT_END_DATE,
  generateDemoScenario,
  type DemoOptions,
} from './generate-demo-scenario';
export { DEMO_DRAWN_EXERCISE, calfStretchDrawing, type LineDrawing } from './demo-drawing';
