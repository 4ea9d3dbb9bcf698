// The door rule refuses imports past another folder's index.ts and names the door to use.
import { RuleTester } from 'eslint';
import path from 'node:path';
import { afterAll, describe, it } from 'vitest';
import { doorsRule } from '../../../eslint/doors-rule.js';
import { ROOT } from '../../../eslint/lib-folders.js';

// RuleTester looks for the test runner's functions on itself (vitest does not make them global here).
Object.assign(RuleTester, { afterAll, describe, it });
const tester = new RuleTester({ languageOptions: { ecmaVersion: 'latest', sourceType: 'module' } });
const at = (file: string) => path.join(ROOT, file);

tester.run('kinnote/doors', doorsRule, {
  valid: [
    { filename: at('src/lib/stats/change.ts'), code: "import { a } from '../domain';", options: [{ arrows: { stats: ['domain'] } }] },
    { filename: at('src/routes/patients/+page.ts'), code: "import { openStore } from '$lib/store';" },
    { filename: at('src/routes/x.ts'), code: "import { a } from '$lib/store/index';" },
    { filename: at('src/lib/ui/session.svelte.ts'), code: "import { openStore } from '$lib/store'; import { x } from './local';" },
    { filename: at('src/lib/stats/change.ts'), code: "import { a } from '../domain'; import { b } from './quantile';" },
    { filename: at('src/lib/ui/team/TeamSection.ts'), code: "import { session } from '../session.svelte';" },
    { filename: at('src/cli/commands/cohort.ts'), code: "import { readBackup } from '../../lib/store';" },
    { filename: at('src/routes/+page.ts'), code: "import { writable } from 'svelte/store'; import x from './local';" },
    {
      filename: at('src/routes/+page.ts'),
      code: "const m = await import('$lib/store/demo-caseload');",
      options: [{ onDemand: ['store/demo-caseload'] }],
    },
    { filename: at('test/unit/store/drafts.test.ts'), code: "import { draftId } from '../../../src/lib/store/drafts';" },
  ],
  invalid: [
    {
      filename: at('src/lib/stats/change.ts'),
      code: "import { openStore } from '$lib/store';",
      options: [{ arrows: { stats: ['domain'] } }],
      errors: [{ message: 'src/lib/stats may not import src/lib/store: the layer diagram in DEVELOPERS.md has no arrow stats -> store (add it there only if it points down a layer).' }],
    },
    {
      filename: at('src/routes/patients/+page.ts'),
      code: "import { openStore } from '$lib/store/open-store';",
      errors: [{ message: "'$lib/store/open-store' goes past the door of src/lib/store: import from '$lib/store' (add the name to src/lib/store/index.ts if it is not exported there)." }],
    },
    {
      filename: at('src/lib/stats/change.ts'),
      code: "export { a } from '../domain/units';",
      errors: [{ messageId: 'pastDoor', data: { spec: '../domain/units', folder: 'domain', door: '$lib/domain' } }],
    },
    {
      filename: at('src/cli/commands/cohort.ts'),
      code: "import { readBackup } from '../../lib/store/import-backup';",
      errors: [{ message: "'../../lib/store/import-backup' goes past the door of src/lib/store: import from '../../lib/store' (add the name to src/lib/store/index.ts if it is not exported there)." }],
    },
    {
      filename: at('src/lib/ui/team/TeamSection.ts'),
      code: "import { session } from '$lib/ui/session.svelte';",
      errors: [{ messageId: 'ownDoor' }],
    },
    {
      filename: at('src/routes/+page.ts'),
      code: "const m = await import('$lib/store/demo-caseload');",
      errors: [{ messageId: 'pastDoorDynamic' }],
    },
    {
      filename: at('src/routes/+page.ts'),
      code: "const m = await import('$lib/store/demo-caseload');",
      options: [{ onDemand: ['store/other'] }],
      errors: [{ messageId: 'pastDoorDynamic' }],
    },
  ],
});
