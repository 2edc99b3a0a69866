import { ensureProjectDatabase } from './mariadb';

/** DATABASE_URL when set (an existing MariaDB); otherwise the project-local MariaDB under .data/. */
export async function resolveDatabaseUrl(database = 'tightloop'): Promise<string> {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  return ensureProjectDatabase(database);
}
