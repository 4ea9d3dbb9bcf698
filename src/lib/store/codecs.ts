import { IdentityFieldsSchema, type RecordTables, type TableName } from '../domain';
import * as v from 'valibot';
import type { SealedText } from './crypto-box';
import { sealAad, type Row } from './rows';
import { StoreError } from './store-error';
import type { Vault } from './vault';

/** Turns a domain record into its at-rest row and back, sealing and opening protected text. */
export interface Codec<K extends TableName> {
  /** Seals protected fields (needs the vault unlocked when there is protected text). */
  toRow(record: RecordTables[K]): Promise<Row<K>>;
  /** Opens protected fields (throws Locked when there are any and the vault is locked). */
  fromRow(row: Row<K>): Promise<RecordTables[K]>;
  /** The domain form with protected text as null, readable while locked; null where that is no valid record (identities). */
  redact(row: Row<K>): RecordTables[K] | null;
  /** Whether writing this record needs the vault. */
  needsVault(record: Partial<RecordTables[K]>): boolean;
  /** Names of the protected fields in the domain form. */
  readonly protectedFields: readonly string[];
  /** Row fields that carry sealed text. */
  readonly sealedFields: readonly string[];
}

const plainCodec = <K extends TableName>(): Codec<K> => ({
  toRow: async (record) => record as unknown as Row<K>,
  fromRow: async (row) => row as unknown as RecordTables[K],
  redact: (row) => row as unknown as RecordTables[K],
  needsVault: () => false,
  protectedFields: [],
  sealedFields: [],
});

function notesCodec<K extends 'assessments' | 'events'>(table: K, vault: Vault): Codec<K> {
  return {
    async toRow(record) {
      const { notes, ...rest } = record;
      const notesSealed = notes === null ? null : await vault.seal(notes, sealAad(table, record.id, 'notes'));
      return { ...rest, notesSealed } as unknown as Row<K>;
    },
    async fromRow(row) {
      const { notesSealed, ...rest } = row as unknown as { notesSealed: SealedText | null; id: string };
      const notes = notesSealed === null ? null : await vault.open(notesSealed, sealAad(table, rest.id, 'notes'));
      return { ...rest, notes } as unknown as RecordTables[K];
    },
    redact(row) {
      const { notesSealed: _sealed, ...rest } = row as unknown as { notesSealed: SealedText | null };
      return { ...rest, notes: null } as unknown as RecordTables[K];
    },
    needsVault: (record) => typeof (record as { notes?: unknown }).notes === 'string',
    protectedFields: ['notes'],
    sealedFields: ['notesSealed'],
  };
}

function identityCodec(vault: Vault): Codec<'identities'> {
  return {
    async toRow(record) {
      const { familyName, givenName, dateOfBirth, contact, ...rest } = record;
      const sealed = await vault.seal(JSON.stringify({ familyName, givenName, dateOfBirth, contact }), sealAad('identities', record.id, 'sealed'));
      return { ...rest, sealed };
    },
    async fromRow(row) {
      const { sealed, ...rest } = row;
      const text = await vault.open(sealed, sealAad('identities', row.id, 'sealed'));
      const fields = v.safeParse(IdentityFieldsSchema, JSON.parse(text));
      if (!fields.success) throw new StoreError('Unknown', `identity ${row.id}: decrypted fields are not valid`);
      return { ...rest, ...fields.output };
    },
    redact: () => null,
    needsVault: () => true,
    protectedFields: ['familyName', 'givenName', 'dateOfBirth', 'contact'],
    sealedFields: ['sealed'],
  };
}

export type Codecs = { readonly [K in TableName]: Codec<K> };

/** One codec per table, bound to the vault. */
export function makeCodecs(vault: Vault): Codecs {
  return {
    patients: plainCodec(),
    identities: identityCodec(vault),
    clinicians: plainCodec(),
    devices: plainCodec(),
    events: notesCodec('events', vault),
    assessments: notesCodec('assessments', vault),
    observations: plainCodec(),
    traces: plainCodec(),
    homeProgrammes: plainCodec(),
    adherenceEntries: plainCodec(),
    selfReports: plainCodec(),
    reliabilityStudies: plainCodec(),
    audit: plainCodec(),
  };
}
