import type { ReactNode } from 'react'
import type { Role } from '#shared/schemas/auth.ts'
import { salesQueuePanels } from '#src/features/orders/components/sales-queue-panels.tsx'
import { OrdersNeedingPlan, PlansAwaitingApproval } from '#src/features/plans/components/plan-queue.tsx'
import { CustomerOrdersPanel } from '#src/features/portal/components/customer-orders-panel.tsx'
import { TestsDuePanel } from '#src/features/cylinders/components/tests-due-panel.tsx'
import { MyFillsPanel } from '#src/features/runs/components/my-fills-panel.tsx'
import { QaAwaitingPanel, QaReadyPanel } from '#src/features/quality/components/qa-queue-lists.tsx'
import { AccountsPanel, RecentActivityPanel } from '#src/features/users/components/admin-panels.tsx'

/**
 * The work-queue panels of each role's home page. Each entry returns the panels for one role;
 * features replace the foundation's panels with live queues as they land.
 */
export const roleQueuePanels: Partial<Record<Role, () => ReactNode[]>> = {
  admin: () => [
    <AccountsPanel key="admin-accounts" />,
    <RecentActivityPanel key="admin-activity" />,
    <TestsDuePanel key="cylinder-tests-due" />,
  ],
  sales: salesQueuePanels,
  blender: () => [<OrdersNeedingPlan key="blender-orders" />, <PlansAwaitingApproval key="blender-approvals" />, <TestsDuePanel key="cylinder-tests-due" />],
  technician: () => [<MyFillsPanel key="tech-fills" />],
  qa: () => [<QaAwaitingPanel key="qa-awaiting" />, <QaReadyPanel key="qa-ready" />],
  customer: () => [<CustomerOrdersPanel key="customer-orders" />],
}
