import { Card } from '#src/components/ui/states.tsx'
import { MyFillsList } from './my-fills-list.tsx'
import { ScanField } from './scan-field.tsx'

/** The technician's home panel: scan field on top, today's fills below. */
export function MyFillsPanel() {
  return (
    <Card title="My fills today" className="lg:col-span-2">
      <div className="space-y-4">
        <ScanField />
        <MyFillsList />
      </div>
    </Card>
  )
}
