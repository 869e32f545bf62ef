import { useQuery } from '@tanstack/react-query'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { qualityQueries } from '../api/quality-queries.ts'
import { CertificateTable } from '../components/certificate-table.tsx'

export async function loader() {
  void queryClient.prefetchQuery(qualityQueries.certificateList({}))
  return null
}

/** The customer's certificates of composition, every revision downloadable. */
export function Component() {
  const list = useQuery(qualityQueries.certificateList({}))
  return (
    <div>
      <PageHeader
        title="Your certificates"
        subtitle="One certificate per cylinder. When a certificate is corrected, the new revision replaces the old one; both stay here."
      />
      <Card title="Certificates of composition">
        {list.isPending ? (
          <SkeletonRows rows={4} />
        ) : list.isError ? (
          <ErrorState error={list.error} retry={() => list.refetch()} />
        ) : list.data.length === 0 ? (
          <EmptyState title="No certificates yet">Each cylinder's certificate appears here, and in your e-mail, as soon as our QA releases it.</EmptyState>
        ) : (
          <CertificateTable certificates={list.data} showCustomer={false} />
        )}
      </Card>
    </div>
  )
}
