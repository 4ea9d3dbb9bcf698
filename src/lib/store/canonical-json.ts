/**
 * Serialises plain JSON data with object keys sorted by UTF-16 code units and no whitespace, so the
 * same records always give the same text (the checksum depends on it). Keys whose value is
 * undefined are dropped, as JSON.stringify does. In the spirit of RFC 8785 (JCS), which also sorts
 * keys by code units; numbers use JavaScript's shortest round-trip form (the same as JCS).
 * Throws TypeError on non-finite numbers, typed arrays, Dates, Maps and other non-plain values, so
 * nothing is silently lost. Cost: O(size) plus sorting keys.
 */
export function canonicalJson(value: unknown): string {
  const parts: string[] = [];
  write(value, parts, '$');
  return parts.join('');
}

function write(value: unknown, out: string[], path: string): void {
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
      write(value[i] === undefined ? null : value[i], out, `${path}[${i}]`);
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
  keys.forEach((key, i) => {
    if (i > 0) out.push(',');
    out.push(JSON.stringify(key), ':');
    write(record[key], out, `${path}.${key}`);
  });
  out.push('}');
}
