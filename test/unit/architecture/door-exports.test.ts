// Each folder's door (src/lib/<folder>/index.ts) exports what the rest of src takes from it, and nothing else.
// Users are src/routes, src/cli, src/server and the other src/lib folders; tests are not users (they may import
// a folder's inner modules by path).
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../../../eslint/lib-folders.js';
import { doorUses, moduleExports, readDoorExports, readDoorUses, unusedDoorNames } from '../../support/door-names';

describe('the doors of src/lib', () => {
  it('export no name that nothing outside their folder takes', () => {
    const doors = readDoorExports();
    expect(unusedDoorNames(doors, readDoorUses(doors))).toEqual([]);
  });
});

describe('the check can fail', () => {
  const at = (file: string) => path.join(ROOT, file);
  const door = at('src/lib/stats/index.ts');
  const doorText = [
    "export { used, planted } from './a';",
    "export type { UsedType } from './b';",
    "export { default as Widget } from './Widget.svelte';",
    'export const literal = 1;',
  ].join('\n');

  it('reads every kind of export a door writes', () => {
    expect([...moduleExports(door, doorText)].sort()).toEqual(['UsedType', 'Widget', 'literal', 'planted', 'used']);
  });

  it('names a planted export that no other folder takes, and not the ones they take', () => {
    const doors = new Map([['stats', moduleExports(door, doorText)]]);
    const namesOf = (folder: string) => doors.get(folder) ?? new Set<string>();
    const uses = [
      ...doorUses(at('src/routes/x/+page.svelte'), "<script lang=\"ts\">\n  import { used as u, Widget } from '$lib/stats';\n</script>", namesOf),
      ...doorUses(at('src/lib/export/y.ts'), "import type { UsedType } from '../stats';", namesOf),
      // The folder's own files and imports past the door do not count.
      ...doorUses(at('src/lib/stats/z.ts'), "import { planted } from '$lib/stats';", namesOf),
      ...doorUses(at('src/cli/w.ts'), "import { literal } from '../lib/stats/a';", namesOf),
    ];
    expect(unusedDoorNames(doors, uses)).toEqual(['stats: literal', 'stats: planted']);
  });

  it('counts a dynamic import of a door by the door names the file uses', () => {
    const doors = new Map([['stats', moduleExports(door, doorText)]]);
    const uses = doorUses(at('src/lib/ui/v.ts'), "const { used, literal } = await import('$lib/stats');", () => doors.get('stats')!);
    expect(uses.map((u) => u.name).sort()).toEqual(['literal', 'used']);
  });
});
