import { PageHeader } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { qualityQueries } from '../api/quality-queries.ts'
import { QaAwaitingPanel, QaReadyPanel } from '../components/qa-queue-lists.tsx'

export async function loader() {
  void queryClient.prefetchQuery(qualityQueries.queue())
  return null
}

export function Component() {
  return (
    <div>
      <PageHeader
        title="Analysis & release"
        subtitle="Filled cylinders waiting for their analysis, and analyses within specification waiting for a signature."
      />
      <div className="grid gap-5 lg:grid-cols-2">
        <QaAwaitingPanel />
        <QaReadyPanel />
      </div>
    </div>
  )
}
