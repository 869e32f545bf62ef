import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { loadEnv } from '../server/env.ts'
import { backupSqlite } from './lib/sqlite-backup.ts'

/**
 * `npm run db:backup -- <dest>`: an online backup of the SQLite database at DATABASE_PATH while the app
 * keeps running (SQLite's backup API; see scripts/sqlite-backup.ts). Prints a JSON report.
 */
// the same settings as the app: .env lines, environment variables winning
const dotEnv = resolve(import.meta.dirname, '..', '.env')
if (existsSync(dotEnv)) process.loadEnvFile(dotEnv)
const dest = process.argv[2]
if (!dest || dest.startsWith('-')) {
  console.error('usage: npm run db:backup -- <destination file>')
  process.exit(2)
}
if (process.env.DATABASE_URL) {
  console.error('DATABASE_URL is set: back up PostgreSQL with its own tool, e.g. pg_dump --format=custom --file=<dest> "$DATABASE_URL".')
  process.exit(2)
}
try {
  const report = await backupSqlite(loadEnv().DATABASE_PATH, dest)
  console.log(JSON.stringify(report, null, 2))
} catch (err) {
  console.error(`backup failed: ${(err as Error).message}`)
  process.exit(1)
}
