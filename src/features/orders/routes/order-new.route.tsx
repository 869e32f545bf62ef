import { useQuery } from '@tanstack/react-query'
import { useNavigate, useSearchParams } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { orderQueries } from '../api/order-queries.ts'
import { useSaveOrder } from '../api/save-order.ts'
import { useTransitionOrder } from '../api/transition-order.ts'
import { emptyOrder, OrderForm } from '../components/order-form.tsx'

export async function loader() {
  void queryClient.prefetchQuery(orderQueries.priceBook())
  void queryClient.prefetchQuery(orderQueries.customers())
  return null
}

export function Component() {
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const book = useQuery(orderQueries.priceBook())
  const customers = useQuery(orderQueries.customers())
  const save = useSaveOrder()
  const send = useTransitionOrder()
  const customerId = Number(params.get('customerId')) || undefined

  return (
    <div>
      <PageHeader
        title="New specification"
        subtitle="Enter what the customer asked for; the price adds up as you type. Save it as a draft or send the quote straight away."
      />
      {book.isPending || customers.isPending ? (
        <SkeletonRows rows={10} />
      ) : book.isError || customers.isError ? (
        <ErrorState error={book.error ?? customers.error} retry={() => (book.isError ? book.refetch() : customers.refetch())} />
      ) : (
        <OrderForm
          defaultValues={emptyOrder(customerId)}
          customers={customers.data.items}
          book={book.data}
          busy={save.isPending || send.isPending}
          error={save.error ?? send.error}
          onCancel={() => navigate(paths.orders.list.href())}
          onSubmit={(input, intent, form) =>
            save.mutate(
              { id: null, input },
              {
                onError: form.setServerErrors,
                onSuccess: (order) => {
                  if (intent === 'send')
                    send.mutate(
                      { id: order.id, to: 'quoted', version: order.version },
                      {
                        onSuccess: () => navigate(paths.orders.detail.href(order.id)),
                        onError: (err) =>
                          navigate(paths.orders.detail.href(order.id), { state: { notice: `Saved, but the quote was not sent: ${err.message}` } }),
                      },
                    )
                  else navigate(paths.orders.detail.href(order.id))
                },
              },
            )
          }
        />
      )}
    </div>
  )
}

export function ErrorBoundary() {
  return (
    <ErrorState error={new Error('The quote screen could not be opened. Check your connection and reload the page.')} retry={() => window.location.reload()} />
  )
}
