import { loadEnv } from './server/env.ts'
import { ormOptions } from './server/db.ts'

// Configuration read by the MikroORM CLI (`npm run orm -- migration:create`).
const env = loadEnv()
export default ormOptions({ databasePath: env.DATABASE_PATH, databaseUrl: env.DATABASE_URL || undefined })
