import type { ReactNode } from 'react'
import type { Role } from '#shared/schemas/auth.ts'
import { Card, EmptyState } from '#src/components/ui/states.tsx'

/**
 * The work-queue panels of each role's home page. Each entry returns the panels for one role;
 * features replace the foundation's panels with live queues as they land.
 */
export const roleQueuePanels: Partial<Record<Role, () => ReactNode[]>> = {
  admin: () => [
    <Card key="admin-accounts" title="Accounts">
      <EmptyState title="No account changes waiting">New staff and customer accounts you create appear here until they first sign in.</EmptyState>
    </Card>,
  ],
  sales: () => [
    <Card key="sales-quotes" title="Quotes to prepare">
      <EmptyState title="No specifications waiting">When a customer sends a mixture specification, it appears here ready to quote.</EmptyState>
    </Card>,
  ],
  blender: () => [
    <Card key="blender-plans" title="Orders needing a fill plan">
      <EmptyState title="Nothing to plan">Accepted orders appear here; open one to build and approve its fill plan.</EmptyState>
    </Card>,
  ],
  technician: () => [
    <Card key="tech-fills" title="My fills today">
      <EmptyState title="No fills assigned to you today">Approved fill plans assigned to you appear here. Scan a cylinder's barcode to open its run.</EmptyState>
    </Card>,
  ],
  qa: () => [
    <Card key="qa-analysis" title="Awaiting analysis">
      <EmptyState title="No cylinders awaiting analysis">Cylinders appear here when the technician finishes their fill run.</EmptyState>
    </Card>,
  ],
  customer: () => [
    <Card key="customer-orders" title="Your orders">
      <EmptyState title="No orders yet">Orders you place with the shop appear here with their status, certificates and invoices.</EmptyState>
    </Card>,
  ],
}
