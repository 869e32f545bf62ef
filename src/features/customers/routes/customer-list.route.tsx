import { keepPreviousData, useQuery } from '@tanstack/react-query'
import { useDeferredValue, useState } from 'react'
import type { Customer } from '#shared/schemas/customer.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input } from '#src/components/ui/field.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { cn } from '#src/lib/cn.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { customerQueries } from '../api/customer-queries.ts'
import { CustomerForm } from '../components/customer-form.tsx'

export async function loader() {
  void queryClient.prefetchQuery(customerQueries.list(''))
  return null
}

export function Component() {
  const [search, setSearch] = useState('')
  const q = useDeferredValue(search.trim())
  const list = useQuery({ ...customerQueries.list(q), placeholderData: keepPreviousData })
  const [editing, setEditing] = useState<Customer | 'new' | null>(null)
  const editingId = editing && editing !== 'new' ? editing.id : null

  return (
    <div>
      <PageHeader
        title="Customers"
        subtitle="Companies the shop quotes for: contact, e-mail for quotes, billing address."
        actions={<Button onClick={() => setEditing('new')}>New customer</Button>}
      />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card title={list.data ? `${list.data.items.length} customer${list.data.items.length === 1 ? '' : 's'}` : 'Customers'}>
          <Field label="Search by code, company, contact or e-mail" className="mb-3">
            {(id) => <Input id={id} type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. ALDB, welding" />}
          </Field>
          {list.isPending ? (
            <SkeletonRows rows={6} />
          ) : list.isError ? (
            <ErrorState error={list.error} retry={() => list.refetch()} />
          ) : list.data.items.length === 0 ? (
            <EmptyState title={q ? 'No customer matches' : 'No customers yet'} action={<Button onClick={() => setEditing('new')}>New customer</Button>}>
              {q ? 'Try part of the company name or the code.' : 'Add the first customer to start quoting.'}
            </EmptyState>
          ) : (
            <div className="overflow-x-auto">
              <table className="w-full text-sm">
                <caption className="sr-only">Customers; choose one to edit it</caption>
                <thead>
                  <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
                    <th scope="col" className="py-2 pr-3">
                      Code
                    </th>
                    <th scope="col" className="py-2 pr-3">
                      Company
                    </th>
                    <th scope="col" className="py-2 pr-3">
                      Contact
                    </th>
                    <th scope="col" className="py-2 pr-3">
                      E-mail
                    </th>
                    <th scope="col" className="py-2">
                      Phone
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {list.data.items.map((c) => (
                    <tr key={c.id} className={cn('border-b border-ink-100', editingId === c.id && 'bg-copper-50')}>
                      <td className="py-1.5 pr-3 font-mono text-xs">{c.code}</td>
                      <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                        <button
                          type="button"
                          className="text-left font-medium text-ink-900 hover:underline"
                          onClick={() => setEditing(c)}
                          aria-pressed={editingId === c.id}
                        >
                          {c.company}
                        </button>
                      </th>
                      <td className="py-1.5 pr-3">{c.contactName}</td>
                      <td className="py-1.5 pr-3">{c.contactEmail}</td>
                      <td className="py-1.5">{c.phone || '—'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </Card>
        <Card title={editing === 'new' ? 'New customer' : editing ? `Edit ${editing.company}` : 'Customer'}>
          {editing ? (
            <CustomerForm
              key={editing === 'new' ? 'new' : editing.id}
              customer={editing === 'new' ? null : editing}
              onDone={(c) => setEditing(c)}
              onCancel={() => setEditing(null)}
            />
          ) : (
            <EmptyState
              title="Choose a customer"
              action={
                <Button variant="secondary" onClick={() => setEditing('new')}>
                  New customer
                </Button>
              }
            >
              Pick a company in the list to edit its contact and billing details, or add a new one.
            </EmptyState>
          )}
        </Card>
      </div>
    </div>
  )
}

export function ErrorBoundary() {
  return (
    <ErrorState error={new Error('The customer list could not be loaded. Check your connection and reload the page.')} retry={() => window.location.reload()} />
  )
}
