import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import type { User } from '#shared/schemas/user.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { cn } from '#src/lib/cn.ts'
import { userQueries } from '../api/user-queries.ts'
import { UserForm } from '../components/user-form.tsx'

export function Component() {
  const users = useQuery(userQueries.list())
  const audit = useQuery(userQueries.audit())
  const [editing, setEditing] = useState<User | 'new' | null>(null)
  return (
    <div>
      <PageHeader
        title="Accounts"
        subtitle="Who may sign in, and what each person may do."
        actions={<Button onClick={() => setEditing('new')}>New account</Button>}
      />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card title="Accounts">
          {users.isPending ? (
            <SkeletonRows />
          ) : users.isError ? (
            <ErrorState error={users.error} retry={() => users.refetch()} />
          ) : (
            <table className="w-full text-sm">
              <caption className="sr-only">Accounts; choose one to edit it</caption>
              <thead>
                <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                  <th scope="col" className="py-2 pr-3">
                    Name
                  </th>
                  <th scope="col" className="py-2 pr-3">
                    E-mail
                  </th>
                  <th scope="col" className="py-2 pr-3">
                    Roles
                  </th>
                  <th scope="col" className="py-2">
                    State
                  </th>
                </tr>
              </thead>
              <tbody>
                {users.data.items.map((u) => (
                  <tr key={u.id} className={cn('border-b border-ink-100', editing !== 'new' && editing?.id === u.id && 'bg-copper-50')}>
                    <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                      <button type="button" className="font-medium hover:underline" onClick={() => setEditing(u)}>
                        {u.name}
                      </button>
                      {u.customerName && <span className="block text-xs text-ink-600">{u.customerName}</span>}
                    </th>
                    <td className="py-1.5 pr-3">{u.email}</td>
                    <td className="py-1.5 pr-3">{u.roles.join(', ')}</td>
                    <td className="py-1.5">{u.active ? 'Active' : 'Deactivated'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </Card>
        <Card title={editing === 'new' ? 'New account' : editing ? `Edit ${editing.name}` : 'Account'}>
          {editing ? (
            <UserForm key={editing === 'new' ? 'new' : editing.id} user={editing === 'new' ? null : editing} onDone={() => setEditing(null)} />
          ) : (
            <EmptyState title="Choose an account">Pick a person in the list to change roles or set a new password, or create a new account.</EmptyState>
          )}
        </Card>
      </div>
      <Card title="Audit trail (latest 100)" className="mt-5">
        {audit.isPending ? (
          <SkeletonRows />
        ) : audit.isError ? (
          <ErrorState error={audit.error} retry={() => audit.refetch()} />
        ) : audit.data.items.length === 0 ? (
          <EmptyState title="Nothing recorded yet">
            Every change to orders, plans, runs, certificates and accounts is recorded here with who made it and when.
          </EmptyState>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm">
              <caption className="sr-only">Audit trail</caption>
              <thead>
                <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                  <th scope="col" className="py-2 pr-3">
                    When
                  </th>
                  <th scope="col" className="py-2 pr-3">
                    Who
                  </th>
                  <th scope="col" className="py-2 pr-3">
                    What
                  </th>
                  <th scope="col" className="py-2">
                    Record
                  </th>
                </tr>
              </thead>
              <tbody className="num">
                {audit.data.items.map((e) => (
                  <tr key={e.id} className="border-b border-ink-100">
                    <td className="py-1 pr-3 whitespace-nowrap">{new Date(e.at).toLocaleString()}</td>
                    <td className="py-1 pr-3">{e.actorEmail ?? 'system'}</td>
                    <td className="py-1 pr-3 font-mono text-xs">{e.action}</td>
                    <td className="py-1">
                      {e.entityType} #{e.entityId}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
    </div>
  )
}
