import {
  OrderDetailSchema,
  OrderIdParamsSchema,
  OrderInputSchema,
  OrderListQuerySchema,
  OrderListSchema,
  OrderQueueCountsSchema,
  OrderUpdateInputSchema,
  TransitionInputSchema,
} from '#shared/schemas/order.ts'
import { defineRoute } from '../../lib/route.ts'
import { createOrder, getOrderDetail, listOrders, ORDER_READERS, orderCounts, quotePdf, sendQuote, transitionOrder, updateOrder } from './orders.service.ts'

const SALES_DESK = ['sales', 'admin'] as const

defineRoute({
  method: 'get',
  path: '/api/orders',
  summary: 'The orders table: filter by status, customer and text; sort; keyset paging (customers: their own orders)',
  tags: ['orders'],
  access: ORDER_READERS,
  query: OrderListQuerySchema,
  response: OrderListSchema,
  handler: ({ em, user, query }) => listOrders(em, user, query),
})

defineRoute({
  method: 'get',
  path: '/api/orders/counts',
  summary: 'Number of orders per status (the home queues; customers: their own orders)',
  tags: ['orders'],
  access: ORDER_READERS,
  response: OrderQueueCountsSchema,
  handler: ({ em, user }) => orderCounts(em, user),
})

defineRoute({
  method: 'post',
  path: '/api/orders',
  summary: 'Enter a specification (a draft order), priced by the server from the price book',
  tags: ['orders'],
  access: SALES_DESK,
  body: OrderInputSchema,
  response: OrderDetailSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createOrder(em, user, body),
})

defineRoute({
  method: 'get',
  path: '/api/orders/:id',
  summary: 'One order: lines with price breakdown, status timeline, the moves open to you',
  tags: ['orders'],
  access: ORDER_READERS,
  params: OrderIdParamsSchema,
  response: OrderDetailSchema,
  handler: ({ em, user, params }) => getOrderDetail(em, user, params.id),
})

defineRoute({
  method: 'put',
  path: '/api/orders/:id',
  summary: 'Edit a specification that has not been quoted yet (re-priced by the server)',
  tags: ['orders'],
  access: SALES_DESK,
  params: OrderIdParamsSchema,
  body: OrderUpdateInputSchema,
  response: OrderDetailSchema,
  handler: ({ em, user, params, body }) => updateOrder(em, user, params.id, body),
})

defineRoute({
  method: 'post',
  path: '/api/orders/:id/transition',
  summary: 'Move an order on: send the quote (re-priced, PDF e-mailed), accept, ship, cancel; the other moves follow the plans, runs, QA and billing',
  tags: ['orders'],
  access: ORDER_READERS,
  params: OrderIdParamsSchema,
  body: TransitionInputSchema,
  response: OrderDetailSchema,
  handler: async ({ em, user, params, body, deps }) => {
    if (body.to === 'quoted') return sendQuote(em, deps, user, params.id, body.version)
    await em.transactional((tx) => transitionOrder(tx, user, params.id, body.to, { expectedVersion: body.version, fromOrderPage: true }))
    return getOrderDetail(em.fork(), user, params.id)
  },
})

defineRoute({
  method: 'get',
  path: '/api/orders/:id/quote.pdf',
  summary: 'The quote as a PDF (customers: their own orders once quoted)',
  tags: ['orders'],
  access: ['sales', 'admin', 'customer'],
  params: OrderIdParamsSchema,
  produces: 'application/pdf',
  handler: async ({ em, user, params, res }) => {
    const { number, pdf } = await quotePdf(em, user, params.id)
    res.setHeader('Content-Type', 'application/pdf')
    res.setHeader('Content-Disposition', `inline; filename="quote-${number}.pdf"`)
    res.send(pdf)
  },
})
