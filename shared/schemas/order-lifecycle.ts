import { z } from 'zod'
import type { Role } from './auth.ts'

/**
 * An order's lifecycle, from the customer's specification to a paid invoice. Fillwright's own labels.
 * Each transition names the roles that may make it (admin may make any).
 */
export const ORDER_STATUSES = ['draft', 'quoted', 'accepted', 'planned', 'filling', 'analysis', 'released', 'shipped', 'invoiced', 'paid', 'cancelled'] as const
export const OrderStatusSchema = z.enum(ORDER_STATUSES)
export type OrderStatus = z.infer<typeof OrderStatusSchema>

export const ORDER_STATUS_LABEL: Record<OrderStatus, string> = {
  draft: 'Specification',
  quoted: 'Quote sent',
  accepted: 'Accepted',
  planned: 'Plan approved',
  filling: 'At the manifold',
  analysis: 'In analysis',
  released: 'Certified',
  shipped: 'Shipped',
  invoiced: 'Invoiced',
  paid: 'Paid',
  cancelled: 'Cancelled',
}

export interface OrderTransition {
  from: OrderStatus
  to: OrderStatus
  roles: readonly Role[]
  /** what the button says */
  action: string
}

export const ORDER_TRANSITIONS: readonly OrderTransition[] = [
  { from: 'draft', to: 'quoted', roles: ['sales'], action: 'Send quote' },
  { from: 'quoted', to: 'accepted', roles: ['sales', 'customer'], action: 'Accept quote' },
  { from: 'accepted', to: 'planned', roles: ['blender'], action: 'Approve fill plans' },
  { from: 'planned', to: 'filling', roles: ['technician', 'blender'], action: 'Start filling' },
  { from: 'filling', to: 'analysis', roles: ['technician', 'blender'], action: 'Send to analysis' },
  { from: 'analysis', to: 'released', roles: ['qa'], action: 'Release certificates' },
  { from: 'released', to: 'shipped', roles: ['sales'], action: 'Mark shipped' },
  { from: 'shipped', to: 'invoiced', roles: ['sales'], action: 'Invoice' },
  { from: 'invoiced', to: 'paid', roles: ['sales'], action: 'Record payment' },
  { from: 'draft', to: 'cancelled', roles: ['sales'], action: 'Cancel order' },
  { from: 'quoted', to: 'cancelled', roles: ['sales', 'customer'], action: 'Cancel order' },
  { from: 'accepted', to: 'cancelled', roles: ['sales'], action: 'Cancel order' },
]

export function allowedTransitions(from: OrderStatus, roles: readonly Role[]): OrderTransition[] {
  return ORDER_TRANSITIONS.filter((t) => t.from === from && (roles.includes('admin') || t.roles.some((r) => roles.includes(r))))
}
