import { useQuery } from '@tanstack/react-query'
import type { ReactNode } from 'react'
import type { Role, SessionUser } from '#shared/schemas/auth.ts'
import { EmptyState, PageHeader } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { roleQueuePanels } from '../queue-panels.tsx'

const TITLES: Record<Role, { title: string; subtitle: string }> = {
  admin: { title: 'Shop overview', subtitle: 'People, accounts and everything moving through the shop.' },
  sales: { title: 'Sales desk', subtitle: 'Specifications to quote, quotes awaiting an answer, orders to invoice.' },
  blender: { title: 'Blending bench', subtitle: 'Orders that need a fill plan, and plans waiting for your approval.' },
  technician: { title: 'Manifold', subtitle: 'Your fills for today, one cylinder at a time.' },
  qa: { title: 'Analysis & release', subtitle: 'Cylinders awaiting analysis, and certificates to release.' },
  customer: { title: 'Your orders', subtitle: 'Status of your cylinders, certificates to download, invoices to pay.' },
}

export function Component() {
  const { data: me } = useQuery(authQueries.me())
  const user = me as SessionUser
  const primary = user.roles[0] ?? 'customer'
  const panels: ReactNode[] = user.roles.flatMap((r) => roleQueuePanels[r]?.() ?? [])
  return (
    <div>
      <PageHeader title={TITLES[primary].title} subtitle={`Signed in as ${user.name}. ${TITLES[primary].subtitle}`} />
      <div className="grid gap-5 lg:grid-cols-2">
        {panels.length ? panels : <EmptyState title="No work queue for your role">Ask an administrator to give your account a role.</EmptyState>}
      </div>
    </div>
  )
}
