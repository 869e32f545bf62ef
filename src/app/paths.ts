/** Route paths and href builders in one place, so links and routes cannot drift apart. */
export const paths = {
  signIn: { path: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  home: { path: '/', href: () => '/' },
  orders: {
    list: { path: '/orders', href: () => '/orders' },
    new: { path: '/orders/new', href: (customerId?: number) => (customerId ? `/orders/new?customerId=${customerId}` : '/orders/new') },
    detail: { path: '/orders/:id', href: (id: number | string) => `/orders/${id}` },
    edit: { path: '/orders/:id/edit', href: (id: number | string) => `/orders/${id}/edit` },
  },
  customers: { path: '/customers', href: () => '/customers' },
  prices: { path: '/prices', href: () => '/prices' },
  portal: {
    home: { path: '/portal', href: () => '/portal' },
    order: { path: '/portal/orders/:id', href: (id: number | string) => `/portal/orders/${id}` },
  },
  accounts: { path: '/accounts', href: () => '/accounts' },
  gases: { path: '/gases', href: () => '/gases' },
  calculator: { path: '/calculator', href: () => '/calculator' },
  conversions: { path: '/conversions', href: () => '/conversions' },
  plans: {
    list: { path: '/plans', href: () => '/plans' },
    new: {
      path: '/plans/new',
      href: (orderLineId?: number, from?: number) => `/plans/new${orderLineId ? `?orderLineId=${orderLineId}${from ? `&from=${from}` : ''}` : ''}`,
    },
    detail: { path: '/plans/:id', href: (id: number | string) => `/plans/${id}` },
  },
  quality: {
    queue: { path: '/quality', href: () => '/quality' },
    run: { path: '/quality/runs/:runId', href: (runId: number | string) => `/quality/runs/${runId}` },
  },
  certificates: { path: '/certificates', href: (id?: number) => (id ? `/certificates?id=${id}` : '/certificates') },
  invoices: { path: '/invoices', href: () => '/invoices' },
  portalDocuments: {
    certificates: { path: '/portal/certificates', href: () => '/portal/certificates' },
    invoices: { path: '/portal/invoices', href: () => '/portal/invoices' },
  },
  cylinders: {
    list: { path: '/cylinders', href: () => '/cylinders' },
    new: { path: '/cylinders/new', href: () => '/cylinders/new' },
    import: { path: '/cylinders/import', href: () => '/cylinders/import' },
    detail: { path: '/cylinders/:id', href: (id: number | string) => `/cylinders/${id}` },
  },
  runs: {
    mine: { path: '/runs', href: () => '/runs' },
    detail: { path: '/runs/:id', href: (id: number | string) => `/runs/${id}` },
  },
} as const
