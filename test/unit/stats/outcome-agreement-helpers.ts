// The cohort side's public face, gathered for the agreement test.
export { buildCohortIndex, pairChange, selectCohort, summariseCohort } from '../../../src/lib/export';
export { measureQuantities as measureQuantitiesForTest } from '../../../src/lib/export/measure-quantities';
