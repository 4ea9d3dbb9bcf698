// The cohort side's public face, gathered for the agreement test.
export { buildCohortIndex, selectCohort, summariseCohort } from '../../../src/lib/export';
export { pairChange } from '../../../src/lib/export/summarise-cohort';
export { measureQuantities as measureQuantitiesForTest } from '../../../src/lib/export/measure-quantities';
