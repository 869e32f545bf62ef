import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { userQueries } from '../api/user-queries.ts'

/** Admin home: who can sign in, by role, and anyone deactivated. */
export function AccountsPanel() {
  const users = useQuery(userQueries.list())
  return (
    <Card title="Accounts" actions={<Link className="text-sm font-medium text-copper-700 underline" to={paths.accounts.href()}>Manage</Link>}>
      {users.isPending ? (
        <SkeletonRows rows={3} />
      ) : users.isError ? (
        <ErrorState error={users.error} retry={() => users.refetch()} />
      ) : (
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
          {(['admin', 'sales', 'blender', 'technician', 'qa', 'customer'] as const).map((role) => (
            <div key={role} className="flex justify-between gap-2 border-b border-ink-100 py-1">
              <dt className="text-ink-600">{role}</dt>
              <dd className="num font-semibold">{users.data.items.filter((u) => u.active && u.roles.includes(role)).length}</dd>
            </div>
          ))}
          <div className="flex justify-between gap-2 border-b border-ink-100 py-1">
            <dt className="text-ink-600">deactivated</dt>
            <dd className="num font-semibold">{users.data.items.filter((u) => !u.active).length}</dd>
          </div>
        </dl>
      )}
    </Card>
  )
}

/** Admin home: the latest changes anyone made. */
export function RecentActivityPanel() {
  const audit = useQuery(userQueries.audit())
  return (
    <Card title="Latest changes" actions={<Link className="text-sm font-medium text-copper-700 underline" to={paths.accounts.href()}>Audit trail</Link>}>
      {audit.isPending ? (
        <SkeletonRows rows={4} />
      ) : audit.isError ? (
        <ErrorState error={audit.error} retry={() => audit.refetch()} />
      ) : audit.data.items.length === 0 ? (
        <EmptyState title="Nothing recorded yet">Changes to orders, plans, fills, certificates and accounts appear here with who made them.</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100 text-sm">
          {audit.data.items.slice(0, 8).map((e) => (
            <li key={e.id} className="flex flex-wrap justify-between gap-x-3 py-1.5">
              <span>
                <span className="font-mono text-xs">{e.action}</span> · {e.entityType} #{e.entityId}
              </span>
              <span className="num text-ink-600">
                {e.actorEmail ?? 'system'} · {new Date(e.at).toLocaleString()}
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  )
}
