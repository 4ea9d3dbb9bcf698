import * as v from 'valibot';
import { IdSchema, IsoDateSchema, recordBaseEntries, TextSchema } from './record-base';

/** Interventions that matter for spasticity outcomes: used as baselines and chart markers. */
export const EVENT_KINDS = [
  'botulinum-toxin-injection',
  'serial-casting',
  'orthosis',
  'intrathecal-pump-change',
  'oral-medication-change',
  'surgery',
  'therapy-block-start',
  'therapy-block-end',
  'other',
] as const;
export type EventKind = (typeof EVENT_KINDS)[number];

export const EVENT_SIDES = ['left', 'right', 'both'] as const;

/**
 * An intervention. For a botulinum toxin injection, `muscles` and `dose` are required free text
 * (products and units differ; the app does not convert doses). `notes` is protected free text:
 * encrypted at rest, readable only while the vault is unlocked.
 */
export const EventSchema = v.pipe(
  v.strictObject({
    ...recordBaseEntries,
    patientId: IdSchema,
    kind: v.picklist(EVENT_KINDS),
    occurredOn: IsoDateSchema,
    endsOn: v.nullable(IsoDateSchema),
    side: v.nullable(v.picklist(EVENT_SIDES)),
    summary: TextSchema(500),
    muscles: v.nullable(TextSchema(500)),
    dose: v.nullable(TextSchema(200)),
    notes: v.nullable(TextSchema(5000)),
  }),
  v.forward(
    v.check(
      (e) => e.kind !== 'botulinum-toxin-injection' || (e.muscles ?? '').trim() !== '',
      'a botulinum toxin injection needs the muscles injected',
    ),
    ['muscles'],
  ),
  v.forward(
    v.check((e) => e.kind !== 'botulinum-toxin-injection' || (e.dose ?? '').trim() !== '', 'a botulinum toxin injection needs the dose'),
    ['dose'],
  ),
  v.forward(
    v.check((e) => e.endsOn === null || e.endsOn >= e.occurredOn, 'must not be before occurredOn'),
    ['endsOn'],
  ),
);
export type ClinicalEvent = v.InferOutput<typeof EventSchema>;

/** Each kind of intervention in plain words, for pages, reports and letters. */
export const EVENT_KIND_LABELS: Readonly<Record<EventKind, string>> = {
  'botulinum-toxin-injection': 'Botulinum toxin injection',
  'serial-casting': 'Serial casting',
  orthosis: 'Orthosis',
  'intrathecal-pump-change': 'Intrathecal pump change',
  'oral-medication-change': 'Oral medication change',
  surgery: 'Surgery',
  'therapy-block-start': 'Therapy block starts',
  'therapy-block-end': 'Therapy block ends',
  other: 'Other',
};
