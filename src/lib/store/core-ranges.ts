import type { DBCoreKeyRange } from 'dexie';

// DBCoreRangeType is a const enum in Dexie's typings (Any = 3, Equal = 1); ANY_RANGE has the shape of
// Dexie's own AnyRange, which the middlewares below the store's DBCore readers read.
export const ANY_RANGE: DBCoreKeyRange = { type: 3, lower: -Infinity, lowerOpen: false, upper: [[]], upperOpen: false };
export const equalRange = (key: string): DBCoreKeyRange => ({ type: 1, lower: key, upper: key });
