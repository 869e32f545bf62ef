import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type CustomerInput, CustomerSchema } from '#shared/schemas/customer.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { customerQueries } from './customer-queries.ts'

/** Creates a customer (no id) or saves an existing one. */
export function useSaveCustomer() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, input }: { id: number | null; input: CustomerInput }) =>
      id === null ? apiClient.post('/api/customers', CustomerSchema, input) : apiClient.put(`/api/customers/${id}`, CustomerSchema, input),
    onSuccess: (customer) => {
      qc.setQueryData(customerQueries.detail(customer.id).queryKey, customer)
      void qc.invalidateQueries({ queryKey: customerQueries.lists() })
    },
  })
}
