// Hex and UUID text of digest bytes, for the de-identified disclosure (pseudonyms and FHIR ids).

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'));

/** Lower-case hex of bytes[from, to). */
export function hex(bytes: Uint8Array, from: number, to: number): string {
  let out = '';
  for (let i = from; i < to; i++) out += HEX[bytes[i] as number];
  return out;
}

/** Formats 16 bytes as a UUID with the version-4 and RFC 9562 variant bits set (random-looking, no time). */
export function uuidFromBytes(bytes: Uint8Array): string {
  const b = Uint8Array.from(bytes.subarray(0, 16));
  b[6] = 0x40 | ((b[6] as number) & 0x0f);
  b[8] = 0x80 | ((b[8] as number) & 0x3f);
  return `${hex(b, 0, 4)}-${hex(b, 4, 6)}-${hex(b, 6, 8)}-${hex(b, 8, 10)}-${hex(b, 10, 16)}`;
}
