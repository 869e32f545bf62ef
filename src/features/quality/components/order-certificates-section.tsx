import { useSuspenseQuery } from '@tanstack/react-query'
import { EmptyState } from '#src/components/ui/states.tsx'
import { qualityQueries } from '../api/quality-queries.ts'
import { CertificateTable } from './certificate-table.tsx'

/** The customer's order page: certificates of this order's cylinders, every revision downloadable. */
export default function OrderCertificatesSection({ order }: { order: { id: number } }) {
  const { data } = useSuspenseQuery(qualityQueries.certificateList({ orderId: order.id }))
  if (data.length === 0)
    return <EmptyState title="No certificates yet">Each cylinder's certificate appears here, and in your e-mail, as soon as our QA releases it.</EmptyState>
  return <CertificateTable certificates={data} showCustomer={false} />
}
