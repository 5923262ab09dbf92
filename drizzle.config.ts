import { defineConfig } from 'drizzle-kit';

// drizzle-kit only generates SQL from the schema here; it never connects.
// The same migrations are applied to embedded PGlite and to a PostgreSQL server.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
});
