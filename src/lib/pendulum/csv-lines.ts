/** [start, end, next]: a line's content range and where the next line starts (> length at the end). */
export function nextLine(text: string, pos: number): [number, number, number] {
  const newline = text.indexOf('\n', pos);
  if (newline < 0) return [pos, text.length, text.length + 1];
  const end = newline > pos && text.charCodeAt(newline - 1) === 13 ? newline - 1 : newline;
  return [pos, end, newline + 1];
}

export function isSpace(code: number): boolean {
  return code === 32 || code === 9 || code === 13;
}

/** A field without its RFC 4180 double quotes (doubled quotes inside become one). */
export function unquote(field: string): string {
  return field.length >= 2 && field.startsWith('"') && field.endsWith('"') ? field.slice(1, -1).replace(/""/g, '"') : field;
}
