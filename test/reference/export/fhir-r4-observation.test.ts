// Checks the cohort FHIR bundle against rules of HL7 FHIR R4 (4.0.1). Sources, by rule:
// - Bundle resource page (hl7.org/fhir/R4/bundle.html): invariants bdl-1 (total only for searchset/
//   history), bdl-2 (entry.search only for searchset), bdl-3 (entry.request only for batch,
//   transaction, history), bdl-4 (entry.response only for *-response, history), bdl-7 (fullUrl unique);
//   wording of bdl-1..4 and bdl-7 seen in a published profile's definition table (build.fhir.org IG
//   page); Bundle.type codes and entry rules from MEMORY of the R4 page.
// - Observation resource page (hl7.org/fhir/R4/observation.html): status 1..1 from ObservationStatus,
//   code 1..1, value[x] choice types, obs-6 (dataAbsentReason only without value[x]), obs-7 (no
//   component value with the Observation's own code), component.code 1..1: MEMORY (not checked in a copy).
// - Data types page: dateTime and instant regular expressions, Quantity qty-3 (a unit code needs a
//   system), uuid "urn:uuid:" + lowercase UUID, code has no leading/trailing/double whitespace: MEMORY.
// - JSON format page: no null values, no empty objects, arrays or strings: MEMORY.
// - UCUM (unitsofmeasure.org): "deg" is the code for the plane-angle degree, "1" for unity: MEMORY.
import { describe, expect, it } from 'vitest';
import { generateDemoScenario } from '../../../src/lib/demo';
import { SeededRandom } from '../../../src/lib/demo/seeded-random';
import { buildCohortIndex, prepareCohortExport, type Disclosure } from '../../../src/lib/export';
import { collectText } from '../../../src/lib/export/text-chunk';

const OBSERVATION_STATUS = ['registered', 'preliminary', 'final', 'amended', 'corrected', 'cancelled', 'entered-in-error', 'unknown'];
const BUNDLE_TYPES = ['document', 'message', 'transaction', 'transaction-response', 'batch', 'batch-response', 'history', 'searchset', 'collection'];
const VALUE_TYPES = ['valueQuantity', 'valueCodeableConcept', 'valueString', 'valueBoolean', 'valueInteger', 'valueRange', 'valueRatio', 'valueSampledData', 'valueTime', 'valueDateTime', 'valuePeriod'];
const DATE_TIME = /^([0-9]([0-9]([0-9][1-9]|[1-9]0)|[1-9]00)|[1-9]000)(-(0[1-9]|1[0-2])(-(0[1-9]|[1-2][0-9]|3[0-1])(T([01][0-9]|2[0-3]):[0-5][0-9]:([0-5][0-9]|60)(\.[0-9]+)?(Z|(\+|-)((0[0-9]|1[0-3]):[0-5][0-9]|14:00)))?)?)?$/;
const INSTANT = /^([0-9]([0-9]([0-9][1-9]|[1-9]0)|[1-9]00)|[1-9]000)-(0[1-9]|1[0-2])-(0[1-9]|[1-2][0-9]|3[0-1])T([01][0-9]|2[0-3]):[0-5][0-9]:([0-5][0-9]|60)(\.[0-9]+)?(Z|(\+|-)((0[0-9]|1[0-3]):[0-5][0-9]|14:00))$/;
const URN_UUID = /^urn:uuid:[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
const CODE = /^[^\s]+(\s[^\s]+)*$/;
const ABSOLUTE_URI = /^[a-z][a-z0-9+.-]*:\S+$/i;
const UCUM = 'http://unitsofmeasure.org';
const UCUM_CODES_USED = new Set(['deg', '1']);
/** External terminologies Kinnote must not pretend to use (its codes are its own). */
const EXTERNAL_SYSTEMS = ['http://loinc.org', 'http://snomed.info/sct', 'http://hl7.org/fhir/sid', 'http://terminology.hl7.org'];

type Json = Record<string, unknown>;

/** Returns every rule broken, as "path: rule" strings (empty when the bundle conforms). */
export function fhirProblems(bundle: Json): string[] {
  const problems: string[] = [];
  const fail = (path: string, rule: string): void => {
    problems.push(`${path}: ${rule}`);
  };

  const walk = (value: unknown, path: string) => {
    if (value === null) fail(path, 'JSON: null is not allowed');
    else if (typeof value === 'string' && value === '') fail(path, 'JSON: empty string');
    else if (Array.isArray(value)) {
      if (value.length === 0) fail(path, 'JSON: empty array');
      value.forEach((v, i) => walk(v, `${path}[${i}]`));
    } else if (typeof value === 'object') {
      const keys = Object.keys(value as object);
      if (keys.length === 0) fail(path, 'JSON: empty object');
      for (const k of keys) walk((value as Json)[k], `${path}.${k}`);
    }
  };
  walk(bundle, 'Bundle');

  const coding = (c: Json, path: string) => {
    if (typeof c.system !== 'string' || !ABSOLUTE_URI.test(c.system)) fail(path, 'Coding.system must be an absolute URI');
    if (typeof c.code !== 'string' || !CODE.test(c.code)) fail(path, 'Coding.code must be a FHIR code');
    if (EXTERNAL_SYSTEMS.some((s) => String(c.system).startsWith(s))) fail(path, `code system ${String(c.system)} is an external terminology`);
  };
  const concept = (cc: unknown, path: string): void => {
    const c = cc as Json | undefined;
    if (!c || typeof c !== 'object') {
      fail(path, 'CodeableConcept required');
      return;
    }
    const codings = c.coding as Json[] | undefined;
    if (!codings && !c.text) fail(path, 'CodeableConcept needs coding or text');
    codings?.forEach((x, i) => coding(x, `${path}.coding[${i}]`));
  };
  const quantity = (q: Json, path: string) => {
    if (typeof q.value !== 'number' || !Number.isFinite(q.value)) fail(path, 'Quantity.value must be a decimal');
    if (q.code !== undefined && q.system === undefined) fail(path, 'qty-3: a unit code needs a system');
    if (q.system !== UCUM) fail(path, 'units must be UCUM');
    if (!UCUM_CODES_USED.has(String(q.code))) fail(path, `UCUM code ${String(q.code)} not expected`);
  };
  const valueOf = (holder: Json, path: string): number => {
    const present = Object.keys(holder).filter((k) => k.startsWith('value'));
    for (const k of present) if (!VALUE_TYPES.includes(k)) fail(path, `${k} is not an allowed value[x] type`);
    if (present.length > 1) fail(path, 'value[x] has at most one type');
    if (holder.valueQuantity) quantity(holder.valueQuantity as Json, `${path}.valueQuantity`);
    if (holder.valueInteger !== undefined && !(Number.isInteger(holder.valueInteger) && Math.abs(holder.valueInteger as number) < 2 ** 31)) fail(path, 'valueInteger must be a 32-bit integer');
    if (holder.valueCodeableConcept) concept(holder.valueCodeableConcept, `${path}.valueCodeableConcept`);
    return present.length;
  };

  if (bundle.resourceType !== 'Bundle') fail('Bundle', 'resourceType must be Bundle');
  if (!BUNDLE_TYPES.includes(String(bundle.type))) fail('Bundle.type', 'not a BundleType code');
  if (bundle.type !== 'collection') fail('Bundle.type', 'expected collection');
  if (bundle.total !== undefined) fail('Bundle.total', 'bdl-1: total only for searchset or history');
  if (bundle.timestamp !== undefined && !INSTANT.test(String(bundle.timestamp))) fail('Bundle.timestamp', 'must be an instant');
  const entries = (bundle.entry as Json[] | undefined) ?? [];
  const fullUrls = new Map<string, Json>();
  entries.forEach((entry, i) => {
    const path = `Bundle.entry[${i}]`;
    if (entry.search) fail(path, 'bdl-2: entry.search only in a searchset');
    if (entry.request) fail(path, 'bdl-3: entry.request only in batch, transaction or history');
    if (entry.response) fail(path, 'bdl-4: entry.response only in responses or history');
    if (!entry.resource) fail(path, 'entry needs a resource here');
    const url = String(entry.fullUrl);
    if (!URN_UUID.test(url)) fail(`${path}.fullUrl`, 'must be urn:uuid: + a lowercase UUID');
    if (fullUrls.has(url)) fail(`${path}.fullUrl`, 'bdl-7: fullUrl must be unique');
    fullUrls.set(url, entry.resource as Json);
  });
  entries.forEach((entry, i) => {
    const r = entry.resource as Json;
    const path = `Bundle.entry[${i}].resource`;
    ((r.meta as Json | undefined)?.tag as Json[] | undefined)?.forEach((t, j) => coding(t, `${path}.meta.tag[${j}]`));
    (r.extension as Json[] | undefined)?.forEach((x, j) => {
      if (!ABSOLUTE_URI.test(String(x.url))) fail(`${path}.extension[${j}]`, 'Extension.url must be an absolute URI');
      if (!Object.keys(x).some((k) => k.startsWith('value'))) fail(`${path}.extension[${j}]`, 'ext-1: extension needs a value or extensions');
    });
    if (r.resourceType === 'Patient') return;
    if (r.resourceType !== 'Observation') {
      fail(path, `unexpected ${String(r.resourceType)}`);
      return;
    }
    if (!OBSERVATION_STATUS.includes(String(r.status))) fail(`${path}.status`, 'required, from ObservationStatus');
    concept(r.code, `${path}.code`);
    const subject = (r.subject as Json | undefined)?.reference;
    if (typeof subject !== 'string') fail(`${path}.subject`, 'subject.reference expected');
    else if (fullUrls.get(subject)?.resourceType !== 'Patient') fail(`${path}.subject`, 'must resolve to a Patient entry of the bundle');
    if (typeof r.effectiveDateTime !== 'string' || !DATE_TIME.test(r.effectiveDateTime)) fail(`${path}.effectiveDateTime`, 'must be a FHIR dateTime');
    const values = valueOf(r, path);
    if (r.dataAbsentReason !== undefined && values > 0) fail(path, 'obs-6: dataAbsentReason only when value[x] is absent');
    const components = (r.component as Json[] | undefined) ?? [];
    if (values === 0 && components.length === 0 && r.dataAbsentReason === undefined) fail(path, 'no value, component or dataAbsentReason');
    const ownCodes = (((r.code as Json).coding as Json[]) ?? []).map((c) => `${String(c.system)}|${String(c.code)}`);
    components.forEach((c, j) => {
      concept(c.code, `${path}.component[${j}].code`);
      const n = valueOf(c, `${path}.component[${j}]`);
      const codes = (((c.code as Json).coding as Json[]) ?? []).map((x) => `${String(x.system)}|${String(x.code)}`);
      if (n > 0 && codes.some((x) => ownCodes.includes(x))) fail(`${path}.component[${j}]`, 'obs-7: component code equals the Observation code');
    });
    if (r.bodySite) concept(r.bodySite, `${path}.bodySite`);
    if (r.method) concept(r.method, `${path}.method`);
  });
  return problems;
}

const demo = generateDemoScenario({ seed: 2 }).tables;
const index = buildCohortIndex(demo);
const key = Uint8Array.from({ length: 32 }, (_, i) => 255 - i);

async function bundleFor(disclosure: Disclosure): Promise<Json> {
  const prepared = await prepareCohortExport(index, { filters: {}, disclosure, files: ['fhir'], now: '2025-07-01T12:00:00.000Z' });
  return JSON.parse(collectText(prepared.files[0]!.chunks())) as Json;
}

describe('FHIR R4 bundle of the cohort (rules named in the file header)', () => {
  const rng = new SeededRandom(8);
  const modes: [string, Disclosure][] = [
    ['de-identified, days from baseline', { kind: 'deidentified', keyBytes: key, dates: { kind: 'days-from-baseline' } }],
    ['de-identified, shifted dates', { kind: 'deidentified', keyBytes: key, dates: { kind: 'shifted', rng: () => rng.next() } }],
    ['identified', { kind: 'identified', identities: demo.identities }],
  ];
  for (const [name, disclosure] of modes) {
    it(`conforms: ${name}`, async () => {
      const bundle = await bundleFor(disclosure);
      expect(fhirProblems(bundle)).toEqual([]);
      const observations = (bundle.entry as Json[]).map((e) => e.resource as Json).filter((r) => r.resourceType === 'Observation');
      expect(observations.length).toBeGreaterThan(100);
      // Every value kind of the demo appears: quantity in degrees, integer, grade, Tardieu components.
      expect(observations.some((o) => (o.valueQuantity as Json | undefined)?.code === 'deg')).toBe(true);
      expect(observations.some((o) => o.valueInteger !== undefined)).toBe(true);
      expect(observations.some((o) => o.valueCodeableConcept !== undefined)).toBe(true);
      expect(observations.some((o) => Array.isArray(o.component) && (o.component as Json[]).length === 4)).toBe(true);
    });
  }

  it('days-from-baseline bundles say their dates are synthetic (meta.tag) and start at 2000-01-01', async () => {
    const bundle = await bundleFor(modes[0]![1]);
    const tags = (bundle.meta as Json).tag as Json[];
    expect(tags.map((t) => t.code)).toContain('synthetic-dates');
    const dates = (bundle.entry as Json[]).map((e) => (e.resource as Json).effectiveDateTime).filter((d): d is string => typeof d === 'string');
    expect(dates.sort()[0]).toBe('2000-01-01');
  });

  it('negative control: the checker finds broken bundles', async () => {
    const bundle = await bundleFor(modes[0]![1]);
    const entries = bundle.entry as Json[];
    const obs = entries.find((e) => (e.resource as Json).resourceType === 'Observation')!;
    const broken: Json = {
      ...bundle,
      total: 3,
      entry: [
        ...entries,
        { ...obs }, // duplicate fullUrl
        { fullUrl: 'urn:uuid:not-a-uuid', resource: { ...(obs.resource as Json), status: 'done', valueQuantity: { value: 3, unit: 'deg', code: 'deg' }, valueInteger: 2 } },
      ],
    };
    const problems = fhirProblems(broken).join('\n');
    expect(problems).toMatch(/bdl-1/);
    expect(problems).toMatch(/bdl-7/);
    expect(problems).toMatch(/lowercase UUID/);
    expect(problems).toMatch(/ObservationStatus/);
    expect(problems).toMatch(/qty-3/);
    expect(problems).toMatch(/at most one type/);
  });
});
