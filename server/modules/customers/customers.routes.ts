import { CustomerIdParamsSchema, CustomerInputSchema, CustomerListQuerySchema, CustomerListSchema, CustomerSchema } from '#shared/schemas/customer.ts'
import { defineRoute } from '../../lib/route.ts'
import { createCustomer, getCustomer, listCustomers, updateCustomer } from './customers.service.ts'

const SALES_DESK = ['sales', 'admin'] as const

defineRoute({
  method: 'get',
  path: '/api/customers',
  summary: 'List customers (search by code, company, contact, e-mail)',
  tags: ['customers'],
  access: SALES_DESK,
  query: CustomerListQuerySchema,
  response: CustomerListSchema,
  handler: ({ em, query }) => listCustomers(em, query),
})

defineRoute({
  method: 'post',
  path: '/api/customers',
  summary: 'Create a customer',
  tags: ['customers'],
  access: SALES_DESK,
  body: CustomerInputSchema,
  response: CustomerSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createCustomer(em, user, body),
})

defineRoute({
  method: 'get',
  path: '/api/customers/:id',
  summary: 'One customer',
  tags: ['customers'],
  access: SALES_DESK,
  params: CustomerIdParamsSchema,
  response: CustomerSchema,
  handler: ({ em, params }) => getCustomer(em, params.id),
})

defineRoute({
  method: 'put',
  path: '/api/customers/:id',
  summary: 'Edit a customer',
  tags: ['customers'],
  access: SALES_DESK,
  params: CustomerIdParamsSchema,
  body: CustomerInputSchema,
  response: CustomerSchema,
  handler: ({ em, user, params, body }) => updateCustomer(em, user, params.id, body),
})
