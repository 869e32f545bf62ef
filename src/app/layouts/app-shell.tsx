import { useQuery } from '@tanstack/react-query'
import { NavLink, Outlet, useNavigate, useNavigation } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { Logo } from '#src/components/logo.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { useSignOut } from '#src/features/auth/api/sign-in.ts'
import { cn } from '#src/lib/cn.ts'
import { NAV } from '../nav.ts'
import { paths } from '../paths.ts'

const ROLE_LABEL: Record<string, string> = {
  admin: 'Admin',
  sales: 'Sales desk',
  blender: 'Blender',
  technician: 'Technician',
  qa: 'QA',
  customer: 'Customer',
}

export function AppShell() {
  const { data: me } = useQuery(authQueries.me())
  const navigation = useNavigation()
  const navigate = useNavigate()
  const signOut = useSignOut()
  const { units, setUnits } = useDisplayUnits()
  const user = me as SessionUser
  const items = NAV.filter((n) => n.roles.some((r) => user?.roles.includes(r)))
  return (
    <div className="min-h-screen">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-30 border-b border-ink-800 bg-ink-900 text-white print:hidden">
        <div className="mx-auto flex max-w-[90rem] flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <NavLink to={paths.home.href()} className="flex items-center gap-2 font-semibold tracking-tight">
            <Logo className="size-7" />
            Fillwright
          </NavLink>
          <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
            {items.map((item) => (
              <NavLink
                key={item.href}
                to={item.href}
                end={item.href === '/' || items.some((other) => other !== item && other.href.startsWith(`${item.href}/`))}
                className={({ isActive }) =>
                  cn('rounded px-3 py-2 text-sm', isActive ? 'bg-copper-600 text-white' : 'text-ink-200 hover:bg-ink-800 hover:text-white')
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="flex items-center gap-3 text-sm">
            <label className="sr-only" htmlFor="unit-pressure">
              Pressure unit
            </label>
            <select
              id="unit-pressure"
              value={units.pressure}
              onChange={(e) => setUnits({ ...units, pressure: e.target.value as typeof units.pressure })}
              className="rounded border border-ink-700 bg-ink-800 px-2 py-1 text-ink-100"
            >
              <option value="bar">bar</option>
              <option value="psi">psi</option>
              <option value="kPa">kPa</option>
            </select>
            <label className="sr-only" htmlFor="unit-temperature">
              Temperature unit
            </label>
            <select
              id="unit-temperature"
              value={units.temperature}
              onChange={(e) => setUnits({ ...units, temperature: e.target.value as typeof units.temperature })}
              className="rounded border border-ink-700 bg-ink-800 px-2 py-1 text-ink-100"
            >
              <option value="degC">°C</option>
              <option value="degF">°F</option>
            </select>
            <span className="hidden text-ink-300 md:inline" data-testid="signed-in-as">
              {user?.name} · {user?.roles.map((r) => ROLE_LABEL[r] ?? r).join(', ')}
            </span>
            <button
              type="button"
              className="rounded border border-ink-600 px-3 py-1.5 text-ink-100 hover:bg-ink-800"
              onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.href(), { replace: true }) })}
            >
              Sign out
            </button>
          </div>
        </div>
        {navigation.state === 'loading' && <div className="h-0.5 w-full animate-pulse bg-copper-400" role="progressbar" aria-label="Loading page" />}
      </header>
      <main id="main" className="mx-auto max-w-[90rem] px-4 py-6">
        <Outlet />
      </main>
    </div>
  )
}
