import type { MikroORM } from '@mikro-orm/core'
import passport from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
import type { Role, SessionUser } from '#shared/schemas/auth.ts'
import { dummyHash, verifyPassword } from '../../lib/passwords.ts'
import { readRow } from '../../lib/prepared-reads.ts'

declare global {
  namespace Express {
    interface User extends SessionUser {}
  }
}

interface UserRow {
  id: number
  email: string
  name: string
  roles: string
  active: number | boolean
  customer_id: number | null
  password_hash?: string
}

function toSessionUser(row: UserRow): SessionUser {
  return {
    id: Number(row.id),
    email: row.email,
    name: row.name,
    roles: (typeof row.roles === 'string' ? JSON.parse(row.roles) : row.roles) as Role[],
    customerId: row.customer_id == null ? null : Number(row.customer_id),
  }
}

/** A passport instance bound to this app's database (no global state shared between test apps). */
export function createPassport(orm: MikroORM): passport.PassportStatic {
  const pp = new passport.Passport() as unknown as passport.PassportStatic
  const conn = () => orm.em.getConnection()

  pp.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      conn()
        .execute<UserRow[]>('select id, email, name, roles, active, customer_id, password_hash from users where email = ?', [email.trim().toLowerCase()])
        .then(async (rows) => {
          const row = rows[0]
          if (!row || !row.active) {
            await verifyPassword(await dummyHash(), password)
            return done(null, false)
          }
          const ok = await verifyPassword(String(row.password_hash), password)
          done(null, ok ? toSessionUser(row) : false)
        })
        .catch((err) => done(err))
    }),
  )
  pp.serializeUser((user, done) => done(null, (user as SessionUser).id))
  // read on every signed-in request (a prepared statement), so a deactivation or a role change takes effect at the
  // user's next request
  pp.deserializeUser((id: number, done) => {
    readRow<UserRow>(orm.em, 'select id, email, name, roles, active, customer_id from users where id = ?', [id])
      .then((row) => {
        // a deactivated or deleted user is signed out at the next request
        done(null, row && row.active ? toSessionUser(row) : false)
      })
      .catch((err) => done(err))
  })
  return pp
}
