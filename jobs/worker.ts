/** The worker process: `npm start` runs it beside the API; production runs as many as it likes. */
import { config } from '../server/config';
import { createDeps } from '../server/deps';
import { startWorkers } from './runtime';

let cfg: ReturnType<typeof config>;
try {
  cfg = config();
} catch (e) {
  console.error((e as Error).message);
  process.exit(1);
}
const deps = createDeps(cfg);
const running = startWorkers(deps, { log: (m) => console.log(`worker: ${m}`) });
console.log(
  `Spoolwright worker started (queues: mail, travelers, documents; outbox dispatcher on; node ${process.version}, pid ${process.pid}, flags: ${process.execArgv.join(' ') || 'none'})`,
);

/** Stopping: running jobs finish first (BullMQ's close waits for them), then the connections close. */
let stopping = false;
async function shutdown() {
  if (stopping) return;
  stopping = true;
  console.log('worker: stopping after the running jobs finish');
  await running.close();
  await deps.close();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
