import { randomBytes } from 'node:crypto';
import { createWriteStream, type WriteStream } from 'node:fs';
import { rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { RefusedInput } from './command';

const reason = (error: unknown): string => (error as NodeJS.ErrnoException).code ?? (error as Error).message ?? String(error);

/** A temporary name beside `path` (same folder, so the final rename is atomic on one file system). */
function temporaryPath(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.part`);
}

/** Refuses an output path that is a folder, before any work is written. */
export async function refuseFolder(path: string, shown: string): Promise<void> {
  const info = await stat(path).catch(() => null);
  if (info?.isDirectory()) throw new RefusedInput(`${shown}: is a folder; give a file name for the output`);
}

/**
 * Writes a whole output file or nothing: the text goes to a temporary file beside `path`, which is
 * renamed over `path` only when every byte is on disk. A full disk, a missing folder, a folder in
 * the way or no permission → RefusedInput naming the path and the reason; the temporary file is
 * removed and `path` is left as it was (never half-written, never reported as written).
 */
export async function writeOutputFile(path: string, text: string, shown = path): Promise<void> {
  await refuseFolder(path, shown);
  const temporary = temporaryPath(path);
  try {
    await writeFile(temporary, text, { encoding: 'utf8', flush: true });
    await rename(temporary, path);
  } catch (error) {
    await unlink(temporary).catch(() => undefined);
    throw new RefusedInput(`${shown}: cannot write the file (${reason(error)}); nothing was written`);
  }
}

/**
 * A streamed output file with the same all-or-nothing rule: chunks go to a temporary file (with an
 * error listener from the start, so a failed write is never an unhandled event), `commit` renames
 * it into place after the stream has closed cleanly, `discard` removes it. Every failure surfaces
 * as RefusedInput naming the path.
 */
export class StreamedOutputFile {
  readonly #stream: WriteStream;
  readonly #temporary: string;
  #failure: unknown = null;

  constructor(
    readonly path: string,
    readonly shown: string,
  ) {
    this.#temporary = temporaryPath(path);
    this.#stream = createWriteStream(this.#temporary, { encoding: 'utf8', flush: true });
    this.#stream.on('error', (error) => {
      this.#failure ??= error;
    });
  }

  #refusal(): RefusedInput {
    return new RefusedInput(`${this.shown}: cannot write the file (${reason(this.#failure)}); nothing was written`);
  }

  /** Writes a chunk, waiting on back-pressure; throws when the stream has failed. */
  async write(text: string): Promise<void> {
    if (this.#failure) throw this.#refusal();
    if (this.#stream.write(text)) return;
    await new Promise<void>((resolve) => {
      const done = () => {
        this.#stream.off('drain', done);
        this.#stream.off('error', done);
        this.#stream.off('close', done);
        resolve();
      };
      this.#stream.on('drain', done);
      this.#stream.on('error', done);
      this.#stream.on('close', done);
    });
    if (this.#failure) throw this.#refusal();
  }

  /** Flushes, closes and renames into place; throws RefusedInput (and removes the temporary file) on any failure. */
  async commit(): Promise<void> {
    if (!this.#failure) {
      await new Promise<void>((resolve) => {
        this.#stream.once('close', () => resolve());
        this.#stream.end();
      });
    }
    if (!this.#failure) {
      try {
        await rename(this.#temporary, this.path);
        return;
      } catch (error) {
        this.#failure = error;
      }
    }
    await this.discard();
    throw this.#refusal();
  }

  /** Closes and removes the temporary file (the final path is never touched). */
  async discard(): Promise<void> {
    if (!this.#stream.closed) await new Promise<void>((resolve) => this.#stream.destroy() && this.#stream.once('close', () => resolve()));
    await unlink(this.#temporary).catch(() => undefined);
  }
}
