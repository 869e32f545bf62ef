// Every module's route file, imported for its defineRoute() declarations. Add one line per module.
import './modules/health/health.routes.ts'
import './modules/auth/auth.routes.ts'

/** Paths that authenticate by other means than the session (signed webhooks) and skip the CSRF check. */
export const CSRF_EXEMPT_PATHS: string[] = ['/api/payments/webhook']
