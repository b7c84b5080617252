/**
 * Where `npm start` keeps its local data and run files: `.data/` in the project, or
 * `SPOOLWRIGHT_DATA_DIR` (with `SPOOLWRIGHT_PORT_OFFSET`, a second set of local services).
 */
import path from 'node:path';

export const PROJECT_ROOT = path.resolve(import.meta.dirname, '..');
export const DATA_DIR = path.resolve(PROJECT_ROOT, process.env.SPOOLWRIGHT_DATA_DIR || '.data');
export const RUN_DIR = path.join(DATA_DIR, 'run');
/** The app runner's pid (scripts/run-app.ts), so `npm run stop` can stop the app and worker first. */
export const APP_PID_FILE = path.join(RUN_DIR, 'app.pid');
