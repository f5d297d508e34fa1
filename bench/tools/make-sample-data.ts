/**
 * Regenerates the small committed files in sample-data/ from the synthetic run generator (an
 * invented engine and an invented shop). One file per format the reader supports; each file's
 * preamble note says what it shows. Run: `npx tsx bench/tools/make-sample-data.ts`.
 * (sample-data/ holds only run files so `analyze sample-data/*` reads every one.)
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { type RunFileFormat, type SyntheticRunOptions, syntheticRunFile } from '../../server/db/synthetic-runs.js';

const dir = fileURLToPath(new URL('../../sample-data/', import.meta.url));
const run: SyntheticRunOptions = { sampleHz: 8, sweepRate: 500, leadInSeconds: 1.5, tailSeconds: 1, afrChannels: 2 };
const ambient = { date: '2031-04-12 10:40', operator: 'Dana K. (Copperline Cycle Works)', temperatureC: 22.4, baroKpa: 100.2, humidityPct: 41 };

const samples: [string, SyntheticRunOptions, RunFileFormat][] = [
  ['baseline-comma-brackets.csv', { seed: 11 }, { preamble: 'colon', conditions: { ...ambient, notes: 'Baseline; comma, units in brackets, LF, UTF-8' } }],
  [
    'stage1-semicolon-decimal-comma.csv',
    { seed: 12, gain: 1.06 },
    {
      delimiter: ';', decimalComma: true, torqueUnit: 'nm', powerUnit: 'kw', lineEnding: '\r\n', encoding: 'utf-8-bom', preamble: 'delimited',
      conditions: { ...ambient, temperatureC: 23.1, notes: 'Stage 1; semicolons, decimal comma, N·m and kW, CRLF, UTF-8 BOM' },
    },
  ],
  [
    'baseline-tab-units-row-utf16.txt',
    { seed: 13 },
    { delimiter: '\t', headerStyle: 'units-row', encoding: 'utf-16le', lineEnding: '\r', preamble: 'colon', conditions: { ...ambient, notes: 'Tabs, units on a second header row, CR line ends, UTF-16 LE' } },
  ],
  [
    'stage1-pipe-abbreviated-lambda.txt',
    { seed: 14, gain: 1.06 },
    { delimiter: '|', headerStyle: 'abbreviated', columns: ['time', 'rpm', 'torque', 'power', 'lambda'], preamble: 'colon', conditions: { ...ambient, notes: 'Pipes, abbreviated names (tq_ftlb, hp), lambda channels' } },
  ],
  [
    'baseline-quoted-thousands-latin1.csv',
    { seed: 15 },
    {
      headerStyle: 'parentheses', quoteThousands: true, encoding: 'latin1', preamble: 'delimited',
      columns: ['time', 'rpm', 'torque', 'power', 'speed', 'map', 'iat', 'afr'],
      conditions: { ...ambient, temperatureC: 21.8, notes: 'Units in parentheses, quoted thousands "5,012", Latin-1 (°C), extra channels' },
    },
  ],
  [
    'stage1-torque-only-kgfm.csv',
    { seed: 16, gain: 1.06 },
    { torqueUnit: 'kgfm', columns: ['rpm', 'torque'], preamble: 'colon', conditions: { ...ambient, notes: 'Torque only, in kgf·m: power is derived' } },
  ],
];

for (const [name, options, format] of samples) {
  const { bytes } = syntheticRunFile({ ...run, ...options }, format);
  writeFileSync(dir + name, bytes);
  process.stdout.write(`${name}: ${bytes.length} bytes\n`);
}
