// Public face of src/lib/export: CSV (RFC 4180), de-identification, FHIR R4.
export { csvCell, csvRow } from './csv-cell';
