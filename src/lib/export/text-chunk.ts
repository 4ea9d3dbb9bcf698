/** A piece of an export file's text and how many data rows (or resources) it completes. */
export interface TextChunk {
  readonly text: string;
  readonly rows: number;
}

/** Default chunk size in UTF-16 code units (about 64 KiB of ASCII): big enough to amortise a postMessage, small enough to keep memory flat. */
export const DEFAULT_CHUNK_CHARS = 64 * 1024;

/**
 * Collects rows into chunks of at least `chunkChars` characters. String concatenation builds a
 * rope in V8, so appending is O(1) per row; each chunk is flattened once when the consumer reads it.
 */
export class ChunkBuilder {
  #text = '';
  #rows = 0;
  constructor(readonly chunkChars: number = DEFAULT_CHUNK_CHARS) {}

  /** Adds text; returns a chunk when the buffer is full, else null. */
  add(text: string, rows: number): TextChunk | null {
    this.#text += text;
    this.#rows += rows;
    return this.#text.length >= this.chunkChars ? this.flush() : null;
  }

  /** The buffered text as a chunk (possibly empty), and an empty buffer. */
  flush(): TextChunk {
    const chunk = { text: this.#text, rows: this.#rows };
    this.#text = '';
    this.#rows = 0;
    return chunk;
  }
}

/** Joins a file's chunks into one string (tests and small exports; large ones stream). */
export function collectText(chunks: Iterable<TextChunk>): string {
  let text = '';
  for (const chunk of chunks) text += chunk.text;
  return text;
}
