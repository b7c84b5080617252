/**
 * npm run setup -- --admin-email you@shop.example --admin-name "Your Name"
 *
 * Prepares an empty installation: creates the database when missing, applies the migrations and
 * creates the first admin. The password comes from the environment variable
 * SPOOLWRIGHT_ADMIN_PASSWORD or is asked for (twice, not echoed) — never from an argument, which
 * would stay in the shell history and the process list. Refuses when an admin exists already.
 * The first sign-in asks the admin to choose a new password.
 */
import { parseArgs } from 'node:util';
import { createInterface } from 'node:readline';
import { Writable } from 'node:stream';
import { firstAdminInput } from '../src/contracts/users';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/client';
import { ensureDatabase, runMigrations } from '../server/db/migrate';
import { HttpError, zodFields } from '../server/http/errors';
import { createFirstAdmin } from '../server/users/service';

function fail(message: string, code = 2): never {
  console.error(`setup: ${message}`);
  process.exit(code);
}

let args: { 'admin-email'?: string; 'admin-name'?: string };
try {
  args = parseArgs({ options: { 'admin-email': { type: 'string' }, 'admin-name': { type: 'string' } }, strict: true }).values;
} catch (e) {
  const msg = (e as Error).message;
  fail(/password/i.test(msg) ? 'the password is never an argument: set SPOOLWRIGHT_ADMIN_PASSWORD or type it when asked' : `${msg}\nusage: npm run setup -- --admin-email <e-mail> --admin-name <name>`);
}
if (!args['admin-email'] || !args['admin-name']) fail('usage: npm run setup -- --admin-email <e-mail> --admin-name <name>');

/** Reads a line without echoing it (the terminal shows nothing while the password is typed). */
function ask(question: string): Promise<string> {
  let muted = false;
  const output = new Writable({
    write(chunk, _enc, cb) {
      if (!muted) process.stdout.write(chunk);
      cb();
    },
  });
  const rl = createInterface({ input: process.stdin, output, terminal: true });
  return new Promise((resolve) => {
    rl.question(question, (answer) => {
      rl.close();
      process.stdout.write('\n');
      resolve(answer);
    });
    muted = true;
  });
}

async function password(): Promise<string> {
  const fromEnv = process.env.SPOOLWRIGHT_ADMIN_PASSWORD;
  if (fromEnv) return fromEnv;
  if (!process.stdin.isTTY) fail('no terminal to ask for the password: set SPOOLWRIGHT_ADMIN_PASSWORD');
  const first = await ask('Password for the first admin (at least 10 characters): ');
  const again = await ask('The same password again: ');
  if (first !== again) fail('the two passwords differ');
  return first;
}

const parsed = firstAdminInput.safeParse({ email: args['admin-email'], name: args['admin-name'], password: await password() });
if (!parsed.success) {
  const lines = Object.entries(zodFields(parsed.error)).map(([k, v]) => `  ${k}: ${v}`);
  fail(`the first admin is not valid:\n${lines.join('\n')}`);
}

const config = loadConfig();
await ensureDatabase(config.databaseUrl);
const { db, pool } = createDb(config.databaseUrl, 2);
try {
  await runMigrations(db);
  const admin = await createFirstAdmin(db, parsed.data);
  console.log(`setup: the database is migrated and ${admin.email} is its first admin.`);
  console.log('setup: sign in with that password; you will be asked to choose a new one at once.');
} catch (e) {
  if (e instanceof HttpError) fail(`refused: ${e.message}`, 1);
  throw e;
} finally {
  await pool.end();
}
