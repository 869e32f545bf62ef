// Every module's route file, imported for its defineRoute() declarations. Add one line per module.
import './modules/health/health.routes.ts'
import './modules/auth/auth.routes.ts'
import './modules/users/users.routes.ts'
import './modules/customers/customers.routes.ts'
import './modules/pricing/pricing.routes.ts'
import './modules/orders/orders.routes.ts'
import './modules/gases/gases.routes.ts'
import './modules/calc/calc.routes.ts'
import './modules/plans/plans.routes.ts'
import './modules/cylinders/cylinders.routes.ts'
import './modules/runs/runs.routes.ts'
import './modules/quality/quality.routes.ts'
import './modules/billing/billing.routes.ts'

/** Paths that authenticate by other means than the session (signed webhooks) and skip the CSRF check. */
export const CSRF_EXEMPT_PATHS: string[] = ['/api/payments/webhook']
