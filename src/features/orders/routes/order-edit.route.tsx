import { useQuery } from '@tanstack/react-query'
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from 'react-router-dom'
import { lineToInput } from '#shared/schemas/order.ts'
import { paths } from '#src/app/paths.ts'
import { EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { orderQueries } from '../api/order-queries.ts'
import { useSaveOrder } from '../api/save-order.ts'
import { useTransitionOrder } from '../api/transition-order.ts'
import { OrderForm } from '../components/order-form.tsx'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) void queryClient.prefetchQuery(orderQueries.detail(id))
  void queryClient.prefetchQuery(orderQueries.priceBook())
  void queryClient.prefetchQuery(orderQueries.customers())
  return null
}

export function Component() {
  const id = Number(useParams().id)
  const navigate = useNavigate()
  const order = useQuery(orderQueries.detail(id))
  const book = useQuery(orderQueries.priceBook())
  const customers = useQuery(orderQueries.customers())
  const save = useSaveOrder()
  const send = useTransitionOrder()

  if (order.isPending || book.isPending || customers.isPending) return <SkeletonRows rows={10} />
  if (order.isError || book.isError || customers.isError) {
    return (
      <ErrorState error={order.error ?? book.error ?? customers.error} retry={() => void Promise.all([order.refetch(), book.refetch(), customers.refetch()])} />
    )
  }
  const o = order.data
  if (o.status !== 'draft') {
    return (
      <EmptyState
        title={`${o.number} can no longer be edited`}
        action={
          <Link className="font-semibold text-copper-700 underline" to={paths.orders.detail.href(o.id)}>
            Back to the order
          </Link>
        }
      >
        Only a specification that has not been quoted can be changed.
      </EmptyState>
    )
  }
  return (
    <div>
      <PageHeader title={`Edit ${o.number}`} subtitle={`${o.customer.company}. The price adds up as you type; the server prices it again when you save.`} />
      <OrderForm
        defaultValues={{
          customerId: o.customer.id,
          reference: o.reference,
          neededBy: o.neededBy,
          rentalDays: o.rentalDays,
          notes: o.notes,
          lines: o.lines.map(lineToInput),
        }}
        customers={customers.data.items}
        book={book.data}
        busy={save.isPending || send.isPending}
        error={save.error ?? send.error}
        onCancel={() => navigate(paths.orders.detail.href(o.id))}
        onSubmit={(input, intent, form) =>
          save.mutate(
            { id: o.id, version: o.version, input },
            {
              onError: form.setServerErrors,
              onSuccess: (saved) => {
                if (intent === 'send')
                  send.mutate(
                    { id: saved.id, to: 'quoted', version: saved.version },
                    {
                      onSuccess: () => navigate(paths.orders.detail.href(saved.id)),
                      onError: (err) =>
                        navigate(paths.orders.detail.href(saved.id), { state: { notice: `Saved, but the quote was not sent: ${err.message}` } }),
                    },
                  )
                else navigate(paths.orders.detail.href(saved.id))
              },
            },
          )
        }
      />
    </div>
  )
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('The order could not be opened for editing. Reload the page to try again.')} retry={() => window.location.reload()} />
}
