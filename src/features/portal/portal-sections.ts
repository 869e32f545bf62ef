import { type ComponentType, lazy } from 'react'
import type { OrderDetail } from '#shared/schemas/order.ts'

/**
 * Extra sections of the customer's order page (certificates, invoices, …). A feature adds one entry here; the
 * page renders each in its own card below the mixtures, in `order` order, inside a Suspense and error boundary
 * of its own so a failing section never hides the rest of the order. Use `lazy(() => import(...))` for the
 * component to keep the portal bundle small.
 */
export interface PortalSectionProps {
  order: OrderDetail
}

export interface PortalSection {
  /** unique id, also the card's DOM id */
  id: string
  /** card title, e.g. "Certificates" */
  title: string
  /** position among the extra sections (smaller first) */
  order: number
  /** shown only when this returns true (default: always) */
  when?: (order: OrderDetail) => boolean
  Component: ComponentType<PortalSectionProps>
}

/** The registry the customer's order page reads. */
export const portalSections: PortalSection[] = [
  {
    id: 'order-certificates',
    title: 'Certificates',
    order: 20,
    when: (o) => ['analysis', 'released', 'shipped', 'invoiced', 'paid'].includes(o.status),
    Component: lazy(() => import('#src/features/quality/components/order-certificates-section.tsx')),
  },
  {
    id: 'order-invoice',
    title: 'Invoice',
    order: 30,
    when: (o) => ['invoiced', 'paid'].includes(o.status),
    Component: lazy(() => import('#src/features/billing/components/order-invoice-section.tsx')),
  },
]
