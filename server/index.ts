import { config } from './config';
import { createDeps } from './deps';
import { createApp } from './app';

const cfg = config();
const deps = createDeps(cfg);
await deps.storage.ensureBucket().catch((e) => console.error(`object store: ${e.message}`));
const app = createApp(deps, { serveClient: true });
const server = app.listen(cfg.port, cfg.host, () => {
  console.log(`Spoolwright API listening on http://${cfg.host}:${cfg.port}`);
});

function shutdown() {
  server.close(() => void deps.close().then(() => process.exit(0)));
  setTimeout(() => process.exit(0), 5_000).unref();
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
