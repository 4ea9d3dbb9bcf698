/**
 * Serialises plain JSON data with object keys sorted by UTF-16 code units and no whitespace, so the
 * same records always give the same text (the checksum depends on it). Keys whose value is
 * undefined are dropped, as JSON.stringify does. In the spirit of RFC 8785 (JCS), which also sorts
 * keys by code units; numbers use JavaScript's shortest round-trip form (the same as JCS).
 * Throws TypeError on non-finite numbers, typed arrays, Dates, Maps and other non-plain values, so
 * nothing is silently lost. Cost: O(size) plus sorting keys.
 */
export function canonicalJson(value: unknown): string {
  const keys = new Set<string>();
  if (value !== undefined && collectKeys(value, keys)) {
    // Fast path, same text: JSON.stringify with an array replacer writes the keys of every object
    // in the array's order (ECMA-262, SerializeJSONObject uses the PropertyList), so the sorted set
    // of all keys gives sorted keys at every depth. collectKeys has already refused everything
    // JSON.stringify would treat differently (non-finite numbers, non-plain objects).
    return JSON.stringify(value, [...keys].sort());
  }
  const parts: string[] = [];
  try {
    write(value, parts, null);
  } catch (error) {
    if (!(error instanceof TypeError)) throw error;
    // Rerun with paths only to name where the bad value is: building a path string for every
    // value made the checksum of a large backup several times slower.
    write(value, [], '$');
    throw error;
  }
  return parts.join('');
}

/** Adds every object key under `value` to `keys`; false when a value is not plain JSON data. */
function collectKeys(value: unknown, keys: Set<string>): boolean {
  if (value === null) return true;
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return true;
    case 'number':
      return Number.isFinite(value);
    case 'object':
      break;
    default:
      return false;
  }
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const item = value[i] as unknown;
      if (item !== undefined && !collectKeys(item, keys)) return false;
    }
    return true;
  }
  const proto = Object.getPrototypeOf(value) as unknown;
  if (proto !== Object.prototype && proto !== null) return false;
  const record = value as Record<string, unknown>;
  for (const key of Object.keys(record)) {
    const item = record[key];
    if (item === undefined) continue;
    // A replacer list makes JSON.stringify read every listed key from every object, inherited ones
    // included: "__proto__" would write an object's prototype where the key is absent. Slow path.
    if (key === '__proto__') return false;
    keys.add(key);
    if (!collectKeys(item, keys)) return false;
  }
  return true;
}

/** `path` is null on the fast pass (no path strings built); the error pass tracks it. */
function write(value: unknown, out: string[], path: string | null): void {
  if (value === null) {
    out.push('null');
    return;
  }
  switch (typeof value) {
    case 'string':
      out.push(JSON.stringify(value));
      return;
    case 'boolean':
      out.push(value ? 'true' : 'false');
      return;
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: ${path} is ${value}, which JSON cannot hold`);
      out.push(JSON.stringify(value));
      return;
    case 'object':
      break;
    default:
      throw new TypeError(`canonicalJson: ${path} is a ${typeof value}`);
  }
  if (Array.isArray(value)) {
    out.push('[');
    for (let i = 0; i < value.length; i++) {
      if (i > 0) out.push(',');
      write(value[i] === undefined ? null : value[i], out, path === null ? null : `${path}[${i}]`);
    }
    out.push(']');
    return;
  }
  const proto = Object.getPrototypeOf(value) as unknown;
  if (proto !== Object.prototype && proto !== null) {
    throw new TypeError(`canonicalJson: ${path} is not a plain object or array`);
  }
  const record = value as Record<string, unknown>;
  const keys = Object.keys(record).filter((k) => record[k] !== undefined).sort();
  out.push('{');
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i] as string;
    if (i > 0) out.push(',');
    out.push(JSON.stringify(key), ':');
    write(record[key], out, path === null ? null : `${path}.${key}`);
  }
  out.push('}');
}
