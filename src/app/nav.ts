import type { Role } from '#shared/schemas/auth.ts'
import { paths } from './paths.ts'

export interface NavItem {
  label: string
  href: string
  roles: readonly Role[]
}

const staff: Role[] = ['admin', 'sales', 'blender', 'technician', 'qa']

/** The shell's navigation; each entry shows only to the roles that use it. */
export const NAV: NavItem[] = [
  { label: 'My queue', href: paths.home.href(), roles: [...staff, 'customer'] },
  { label: 'Orders', href: paths.orders.list.href(), roles: staff },
  { label: 'My orders', href: paths.portal.home.href(), roles: ['customer'] },
  { label: 'Customers', href: paths.customers.href(), roles: ['admin', 'sales'] },
  { label: 'Price book', href: paths.prices.href(), roles: ['admin', 'sales'] },
  { label: 'Fill plans', href: paths.plans.list.href(), roles: ['admin', 'blender', 'qa'] },
  { label: 'Analysis & release', href: paths.quality.queue.href(), roles: ['admin', 'qa'] },
  { label: 'Certificates', href: paths.certificates.href(), roles: ['admin', 'qa', 'sales', 'blender'] },
  { label: 'Invoices', href: paths.invoices.href(), roles: ['admin', 'sales'] },
  { label: 'My certificates', href: paths.portalDocuments.certificates.href(), roles: ['customer'] },
  { label: 'My invoices', href: paths.portalDocuments.invoices.href(), roles: ['customer'] },
  { label: 'My fills', href: paths.runs.mine.href(), roles: ['technician', 'blender', 'admin'] },
  { label: 'Cylinders', href: paths.cylinders.list.href(), roles: staff },
  { label: 'State calculator', href: paths.calculator.href(), roles: staff },
  { label: 'Conversions', href: paths.conversions.href(), roles: staff },
  { label: 'Gas library', href: paths.gases.href(), roles: staff },
  { label: 'Accounts', href: paths.accounts.href(), roles: ['admin'] },
]
