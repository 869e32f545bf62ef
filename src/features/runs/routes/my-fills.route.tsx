import { PageHeader } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { runQueries } from '../api/run-queries.ts'
import { MyFillsList } from '../components/my-fills-list.tsx'
import { ScanField } from '../components/scan-field.tsx'

export async function loader() {
  void queryClient.prefetchQuery(runQueries.mine())
  return null
}

export function Component() {
  return (
    <div className="mx-auto max-w-4xl space-y-5">
      <PageHeader title="My fills today" subtitle="Scan a cylinder, or tap a fill to open it. Fills not finished on earlier days are listed too." />
      <ScanField autoFocus />
      <MyFillsList />
    </div>
  )
}
