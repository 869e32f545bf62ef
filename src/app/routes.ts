import type { RouteObject } from 'react-router-dom'

/** The pages inside the shell; each is code-split (lazy) and exports `Component` (and optionally `loader`). */
export const featureRoutes: RouteObject[] = [
  { index: true, lazy: () => import('#src/features/home/routes/home.route.tsx') },
]
