/** Route paths and href builders in one place, so links and routes cannot drift apart. */
export const paths = {
  signIn: { path: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  home: { path: '/', href: () => '/' },
  gases: { path: '/gases', href: () => '/gases' },
  calculator: { path: '/calculator', href: () => '/calculator' },
  conversions: { path: '/conversions', href: () => '/conversions' },
} as const
