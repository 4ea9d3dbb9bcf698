import { resolve } from 'node:path';
import { DEMO_DEFAULT_END_DATE } from '../../lib/demo';
import { serializeBundle, demoBundle } from '../../lib/store';
import { optionDate, parseOptions, RefusedInput, type CliCommand } from '../command';
import { writeOutputFile } from '../output-file';

/** `kinnote demo --out FILE.json [--seed N] [--end YYYY-MM-DD]`: writes the invented demo caseload as a backup bundle. */
export const demoCommand: CliCommand = {
  name: 'demo',
  summary: 'write the invented demo caseload as an unencrypted backup bundle',
  usage: [
    'kinnote demo --out FILE.json [--seed N] [--end YYYY-MM-DD]',
    '',
    'Writes the invented demo scenario (fictional team, patients and identities) as a Kinnote backup',
    'bundle, the same data the app loads as its demo. Same seed and end date give the same file.',
    `Defaults: --seed 1, --end ${DEMO_DEFAULT_END_DATE}. Prints a JSON summary on stdout.`,
  ].join('\n'),
  async run(args, io) {
    const { positional, values } = parseOptions(args, ['out', 'seed', 'end']);
    if (positional.length > 0) throw new RefusedInput(`unexpected argument "${positional[0]}"`);
    const out = values.get('out');
    if (!out) throw new RefusedInput('--out FILE.json is required');
    const seedText = values.get('seed') ?? '1';
    if (!/^-?\d{1,10}$/.test(seedText)) throw new RefusedInput(`--seed must be a whole number, not "${seedText}"`);
    // The demo spans about two years before its end; records stamped before 2000 would be refused on import.
    const endDate = optionDate(values.get('end'), 'end', '2003-01-01', '2100-12-31') ?? DEMO_DEFAULT_END_DATE;
    const seed = Number(seedText);
    const bundle = await demoBundle({ seed, endDate });
    const path = resolve(io.cwd, out);
    await writeOutputFile(path, serializeBundle(bundle), out);
    const counts = Object.fromEntries(Object.entries(bundle.tables).map(([table, records]) => [table, records.length]));
    io.stdout(JSON.stringify({ out: path, seed, endDate, checksum: bundle.checksum.value, counts }, null, 2));
    return 0;
  },
};
