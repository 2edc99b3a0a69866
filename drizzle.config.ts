import { defineConfig } from 'drizzle-kit';

// Migrations are generated from server/db/schema and committed; drizzle-kit needs no database to generate them.
export default defineConfig({
  dialect: 'mysql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
});
