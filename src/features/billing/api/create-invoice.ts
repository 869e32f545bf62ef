import { useMutation, useQueryClient } from '@tanstack/react-query'
import { CreateInvoiceResultSchema } from '#shared/schemas/billing.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { billingQueries } from './billing-queries.ts'

/** Invoices a shipped order through the payment provider. */
export function useCreateInvoice() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (orderId: number) => apiClient.post('/api/invoices', CreateInvoiceResultSchema, { orderId }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: billingQueries.all() })
      // the order moved to "Invoiced": lists of other features refetch on their next mount
      void qc.invalidateQueries({ queryKey: ['orders'] })
    },
  })
}
