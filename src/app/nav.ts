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
  { label: 'State calculator', href: paths.calculator.href(), roles: staff },
  { label: 'Conversions', href: paths.conversions.href(), roles: staff },
  { label: 'Gas library', href: paths.gases.href(), roles: staff },
]
