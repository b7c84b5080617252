import { defineConfig } from 'drizzle-kit';
import { loadConfig } from './server/config';

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './drizzle',
  dbCredentials: { url: loadConfig().databaseUrl },
});
