/**
 * `npm run sync -- --server URL --token TOKEN FOLDER`: the sync agent for the dyno PC (Windows,
 * macOS or Linux, Node 20). Sends every run file that appears or changes in FOLDER to Pullbook,
 * where it lands in whatever is on that dyno now (or in the shop's inbox). Runs until stopped.
 *
 *   --server URL      Pullbook's address, e.g. https://pullbook.example.com
 *   --token TOKEN     the dyno's device token (or set PULLBOOK_DEVICE_TOKEN instead)
 *   --journal FILE    where to remember what was sent (default: a file in ~/.pullbook-sync/)
 *   --poll            poll the folder instead of OS events (network shares)
 *   --settle-ms N     how long a file must stop growing before it is sent (default 1000)
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { SyncAgent } from '../sync-agent/agent';

const USAGE = 'usage: npm run sync -- --server URL --token TOKEN [--journal FILE] [--poll] [--settle-ms N] FOLDER';

function fail(message: string): never {
  console.error(`pullbook sync: ${message}\n${USAGE}`);
  process.exit(2);
}

async function main() {
  const { values, positionals } = parseArgs({
    allowPositionals: true,
    options: {
      server: { type: 'string' },
      token: { type: 'string' },
      journal: { type: 'string' },
      poll: { type: 'boolean', default: false },
      'settle-ms': { type: 'string' },
      help: { type: 'boolean', default: false },
    },
  });
  if (values.help) {
    console.log(USAGE);
    return;
  }
  const server = values.server ?? process.env.PULLBOOK_SERVER;
  const token = values.token ?? process.env.PULLBOOK_DEVICE_TOKEN;
  const folder = positionals[0];
  if (!server) fail('give the server address with --server');
  if (!/^https?:\/\//.test(server)) fail(`--server must start with http:// or https:// (got "${server}")`);
  if (!token) fail('give the dyno’s device token with --token (or PULLBOOK_DEVICE_TOKEN)');
  if (!folder) fail('name the folder the dyno saves its run files in');
  if (!fs.existsSync(folder) || !fs.statSync(folder).isDirectory()) fail(`"${folder}" is not a folder`);
  const settleMs = values['settle-ms'] ? Number(values['settle-ms']) : 1000;
  if (!Number.isFinite(settleMs) || settleMs < 100) fail('--settle-ms must be a number of milliseconds, at least 100');

  const id = createHash('sha256').update(`${server}\n${path.resolve(folder)}`).digest('hex').slice(0, 12);
  const journalFile = values.journal ?? path.join(os.homedir(), '.pullbook-sync', `journal-${id}.json`);
  const stamp = () => new Date().toISOString().replace('T', ' ').slice(0, 19);
  const agent = new SyncAgent({ server, token, folder, journalFile, settleMs, poll: values.poll, log: (line) => console.log(`${stamp()}  ${line}`) });

  let skipped = 0;
  let fatal = false;
  agent.on((e) => {
    if (e.kind === 'skipped') skipped++;
    if (e.kind === 'token-refused') {
      console.error(`${stamp()}  The server refused this device token (${e.message}). It is wrong or has been revoked: ` + 'create a new one on the Dynos settings page and start the agent again.');
    }
    if (e.kind === 'fatal') fatal = true;
    if (e.kind === 'fatal') console.error(`${stamp()}  Stopped: ${e.message}. Nothing was marked as sent.`);
  });
  const stop = () => void agent.stop();
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);

  console.log(`${stamp()}  watching ${path.resolve(folder)} → ${server} (journal ${journalFile})`);
  await agent.start();
  setTimeout(() => {
    if (skipped) console.log(`${stamp()}  ${skipped} file${skipped === 1 ? ' was' : 's were'} sent before and skipped`);
  }, 2000).unref();
  const { tokenRefused } = await agent.done;
  process.exit(tokenRefused || fatal ? 2 : 0);
}

main().catch((err) => {
  console.error('pullbook sync failed:', err);
  process.exit(1);
});
