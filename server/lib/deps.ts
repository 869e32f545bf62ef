import type { MikroORM } from '@mikro-orm/core'
import type { RequestHandler } from 'express'
import type passport from 'passport'
import type { Mailer } from './mailer.ts'
import type { Payments } from './payments.ts'

/** What createApp(deps) hands to every route handler as ctx.deps. */
export interface AppDeps {
  orm: MikroORM
  mailer: Mailer
  payments: Payments
  publicUrl: string
  uploadDir: string
  webhookSecret: string
}

/** Built inside createApp from the deps. */
export interface AppInternals {
  passport: passport.PassportStatic
  loginLimiters: RequestHandler[]
}
