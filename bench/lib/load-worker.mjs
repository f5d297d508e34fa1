// Load generator in its own thread, so the app under test (in the main thread) does not share
// an event loop with the client that measures it. Plain JS: workers get no TypeScript loader.
import { parentPort, workerData } from 'node:worker_threads';
import autocannon from 'autocannon';

const { options, paths } = workerData;
let next = 0;
const requests = paths?.length ? [{ method: options.method ?? 'GET', setupRequest: (req) => ({ ...req, path: paths[next++ % paths.length] }) }] : undefined;
const times = [];
let errors = 0;
const instance = autocannon({ ...options, ...(requests ? { requests } : {}) }, (err) => {
  if (err) parentPort.postMessage({ error: String(err) });
  else parentPort.postMessage({ times, errors });
});
instance.on('response', (_client, statusCode, _bytes, responseTime) => {
  if (statusCode !== 200) errors += 1;
  times.push(responseTime);
});
