import { ROLES } from '../src/contracts/roles';
import { createApp } from './app';
import { config, type Config } from './config';
import { createDeps } from './deps';
import { DEMO_PASSWORD, demoEmail } from './seed/demo';

let cfg: Config;
try {
  cfg = config();
} catch (e) {
  // A bad or missing setting: say which, without a stack trace.
  console.error((e as Error).message);
  process.exit(1);
}
const deps = createDeps(cfg);
await deps.storage.ensureBucket().catch((e) => console.error(`object store: ${e.message}`));
const app = createApp(deps, { serveClient: true });

const server = app.listen(cfg.port, cfg.host, () => {
  if (process.env.SPOOLWRIGHT_BANNER) {
    const lines = [
      '',
      `  Spoolwright is running at ${cfg.publicUrl}`,
      ...(cfg.mailViewerUrl ? [`  Mailbox viewer (caught e-mail): ${cfg.mailViewerUrl}`] : []),
      '',
      `  Demo sign-ins (password: ${DEMO_PASSWORD})`,
      ...ROLES.map((r) => `    ${r.padEnd(9)} ${demoEmail(r)}`),
      '',
      '  Ctrl-C stops the app; `npm run stop` stops the app and then the local services.',
      '',
    ];
    console.log(lines.join('\n'));
  } else {
    // The node flags show how it runs: the compiled build (npm run start:prod) needs no TypeScript loader.
    console.log(`Spoolwright API listening on http://${cfg.host}:${cfg.port} (node ${process.version}, pid ${process.pid}, flags: ${process.execArgv.join(' ') || 'none'})`);
  }
});
server.on('error', (e) => {
  console.error(`Cannot listen on ${cfg.host}:${cfg.port}: ${e.message}`);
  process.exit(1);
});

/**
 * Stopping (SIGTERM from `npm run stop` or a process manager, or Ctrl-C): take no new
 * connections, let the requests in flight finish (live board streams are ended, their clients
 * reconnect elsewhere), then close the connections to the services. Anything still open after
 * the grace period is cut.
 */
const GRACE_MS = 20_000;
const inFlight = new Set<import('node:http').ServerResponse>();
server.on('request', (_req, res) => {
  inFlight.add(res);
  res.once('close', () => inFlight.delete(res));
});
const isStream = (res: import('node:http').ServerResponse) => String(res.getHeader('content-type') ?? '').startsWith('text/event-stream');

let stopping = false;
function shutdown() {
  if (stopping) return;
  stopping = true;
  server.close(() => void deps.close().finally(() => process.exit(0)));
  server.closeIdleConnections();
  for (const res of inFlight) if (isStream(res)) res.end();
  const until = Date.now() + GRACE_MS;
  const poll = setInterval(() => {
    server.closeIdleConnections();
    const busy = [...inFlight].filter((r) => !isStream(r)).length;
    if (busy === 0 || Date.now() > until) {
      clearInterval(poll);
      server.closeAllConnections();
    }
  }, 100);
  setTimeout(() => process.exit(0), GRACE_MS + 5_000).unref();
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
