// The import path as it was on main before the import's own speed-ups (commit BASE), extracted from git into
// test-output/ so a bench can run it beside the present code in the same run, on the same file.
// IMPORT_BENCH_BASE names another commit. Returns null (and the bench says so) without git history.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';

export const IMPORT_BENCH_BASE = process.env.IMPORT_BENCH_BASE ?? '8179a2f';

/** The folder holding BASE's `src/lib`, or null when git cannot give it. */
export function mainSourceTree(): { dir: string; commit: string } | null {
  try {
    const commit = execFileSync('git', ['rev-parse', '--short', `${IMPORT_BENCH_BASE}^{commit}`], { encoding: 'utf8' }).trim();
    const dir = resolve('test-output', 'main-path', commit);
    if (!existsSync(join(dir, 'src', 'lib', 'store', 'index.ts'))) {
      mkdirSync(dir, { recursive: true });
      execFileSync('sh', ['-c', `git archive ${commit} src/lib | tar -x -C "${dir}"`]);
    }
    return { dir, commit };
  } catch {
    return null;
  }
}
