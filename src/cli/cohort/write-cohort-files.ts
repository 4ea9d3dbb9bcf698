import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { runCohortExport, type CohortFileKind } from '../../lib/export';
import { RefusedInput } from '../command';
import { refuseFolder, StreamedOutputFile } from '../output-file';

/** One file written: where, what, how many rows and characters. */
export interface WrittenCohortFile {
  readonly file: string;
  readonly kind: CohortFileKind;
  readonly rows: number;
  readonly characters: number;
}

/** Step 4 of `kinnote cohort`: the output folder `outDir` (relative to `cwd`), created when missing. */
export async function makeOutputFolder(cwd: string, outDir: string): Promise<string> {
  const dir = resolve(cwd, outDir);
  try {
    await mkdir(dir, { recursive: true });
  } catch (error) {
    throw new RefusedInput(`${outDir}: cannot create the directory (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
  }
  return dir;
}

/**
 * Step 5 of `kinnote cohort`: streams every prepared file into `dir` (named `outDir` in messages).
 * Every file goes to a temporary name first and is renamed into place only when all of them were
 * written: a full disk or a folder in the way leaves no partial file and no success report.
 */
export async function writeCohortFiles(prepared: Parameters<typeof runCohortExport>[0], dir: string, outDir: string): Promise<WrittenCohortFile[]> {
  const written: WrittenCohortFile[] = [];
  for (const f of prepared.files) await refuseFolder(join(dir, f.fileName), join(outDir, f.fileName));
  const outputs: StreamedOutputFile[] = [];
  let current: StreamedOutputFile | null = null;
  let characters = 0;
  try {
    await runCohortExport(prepared, {
      onFileStart: (f) => {
        current = new StreamedOutputFile(join(dir, f.fileName), join(outDir, f.fileName));
        outputs.push(current);
        characters = 0;
      },
      onChunk: (_f, chunk) => {
        characters += chunk.length;
        return (current as StreamedOutputFile | null)!.write(chunk);
      },
      onFileEnd: (f) => {
        written.push({ file: join(dir, f.fileName), kind: f.kind, rows: f.rows, characters });
      },
    });
    for (const output of outputs) await output.commit();
  } catch (error) {
    for (const output of outputs) await output.discard();
    throw error;
  }
  return written;
}
