import type { RouteObject } from 'react-router-dom'
import { paths } from './paths.ts'

/** The pages inside the shell; each is code-split (lazy) and exports `Component` (and optionally `loader`). */
export const featureRoutes: RouteObject[] = [
  { index: true, lazy: () => import('#src/features/home/routes/home.route.tsx') },
  { path: paths.orders.list.path, lazy: () => import('#src/features/orders/routes/order-list.route.tsx') },
  { path: paths.orders.new.path, lazy: () => import('#src/features/orders/routes/order-new.route.tsx') },
  { path: paths.orders.detail.path, lazy: () => import('#src/features/orders/routes/order-detail.route.tsx') },
  { path: paths.orders.edit.path, lazy: () => import('#src/features/orders/routes/order-edit.route.tsx') },
  { path: paths.customers.path, lazy: () => import('#src/features/customers/routes/customer-list.route.tsx') },
  { path: paths.prices.path, lazy: () => import('#src/features/pricing/routes/price-book.route.tsx') },
  { path: paths.portal.home.path, lazy: () => import('#src/features/portal/routes/portal.route.tsx') },
  { path: paths.portal.order.path, lazy: () => import('#src/features/portal/routes/portal-order.route.tsx') },
  { path: paths.accounts.path, lazy: () => import('#src/features/users/routes/accounts.route.tsx') },
  { path: paths.gases.path, lazy: () => import('#src/features/gases/routes/gas-library.route.tsx') },
  { path: paths.calculator.path, lazy: () => import('#src/features/calculator/routes/calculator.route.tsx') },
  { path: paths.conversions.path, lazy: () => import('#src/features/conversions/routes/conversions.route.tsx') },
  { path: paths.plans.list.path, lazy: () => import('#src/features/plans/routes/plan-list.route.tsx') },
  { path: paths.plans.new.path, lazy: () => import('#src/features/plans/routes/plan-new.route.tsx') },
  { path: paths.plans.detail.path, lazy: () => import('#src/features/plans/routes/plan-detail.route.tsx') },
  { path: paths.quality.queue.path, lazy: () => import('#src/features/quality/routes/qa-queue.route.tsx') },
  { path: paths.quality.run.path, lazy: () => import('#src/features/quality/routes/qa-run.route.tsx') },
  { path: paths.certificates.path, lazy: () => import('#src/features/quality/routes/certificates.route.tsx') },
  { path: paths.invoices.path, lazy: () => import('#src/features/billing/routes/invoices.route.tsx') },
  { path: paths.portalDocuments.certificates.path, lazy: () => import('#src/features/quality/routes/portal-certificates.route.tsx') },
  { path: paths.portalDocuments.invoices.path, lazy: () => import('#src/features/billing/routes/portal-invoices.route.tsx') },
  { path: paths.cylinders.list.path, lazy: () => import('#src/features/cylinders/routes/cylinder-list.route.tsx') },
  { path: paths.cylinders.new.path, lazy: () => import('#src/features/cylinders/routes/cylinder-new.route.tsx') },
  { path: paths.cylinders.import.path, lazy: () => import('#src/features/cylinders/routes/cylinder-import.route.tsx') },
  { path: paths.cylinders.detail.path, lazy: () => import('#src/features/cylinders/routes/cylinder-detail.route.tsx') },
  { path: paths.runs.mine.path, lazy: () => import('#src/features/runs/routes/my-fills.route.tsx') },
  { path: paths.runs.detail.path, lazy: () => import('#src/features/runs/routes/run.route.tsx') },
]
