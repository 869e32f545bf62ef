import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { loadEnv } from '../server/env.ts'
import { DatabaseInUseError, restoreSqlite } from './lib/sqlite-backup.ts'

/**
 * `npm run db:restore -- <backup file>`: replaces the SQLite database at DATABASE_PATH with a backup.
 * Stop the app first: the command refuses (exit 3) while any process has the database open. The
 * replaced database is kept beside it as `<file>.before-restore-<time>`. Prints a JSON report.
 */
// the same settings as the app: .env lines, environment variables winning
const dotEnv = resolve(import.meta.dirname, '..', '.env')
if (existsSync(dotEnv)) process.loadEnvFile(dotEnv)
const src = process.argv[2]
if (!src || src.startsWith('-')) {
  console.error('usage: npm run db:restore -- <backup file>   (stop the app first)')
  process.exit(2)
}
if (process.env.DATABASE_URL) {
  console.error('DATABASE_URL is set: restore PostgreSQL with its own tool, e.g. pg_restore --clean --dbname="$DATABASE_URL" <file>.')
  process.exit(2)
}
try {
  const report = await restoreSqlite(src, loadEnv().DATABASE_PATH)
  console.log(JSON.stringify(report, null, 2))
} catch (err) {
  console.error(`restore refused: ${(err as Error).message}`)
  process.exit(err instanceof DatabaseInUseError ? 3 : 1)
}
