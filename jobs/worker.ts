/** The worker process: `npm start` runs it beside the API; production runs as many as it likes. */
import { config } from '../server/config';
import { createDeps } from '../server/deps';
import { startWorkers } from './runtime';

const deps = createDeps(config());
const running = startWorkers(deps, { log: (m) => console.log(`worker: ${m}`) });
console.log('Spoolwright worker started (queues: mail, travelers, documents; outbox dispatcher on)');

async function shutdown() {
  await running.close();
  await deps.close();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
