import { createBrowserRouter, type LoaderFunctionArgs, Outlet, redirect, RouterProvider, useRouteError } from 'react-router-dom'
import { ErrorState } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { AppShell } from './layouts/app-shell.tsx'
import { paths } from './paths.ts'
import { featureRoutes } from './routes.ts'

/** Every page below the shell needs a signed-in user. */
async function requireUser({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(authQueries.me())
  if (!me) {
    const url = new URL(request.url)
    throw redirect(paths.signIn.href(url.pathname + url.search))
  }
  return null
}

function RouteError() {
  const error = useRouteError()
  return (
    <div className="mx-auto max-w-xl p-8">
      <ErrorState error={error} retry={() => window.location.reload()} />
    </div>
  )
}

function NotFound() {
  return (
    <div className="mx-auto max-w-xl p-8 text-center">
      <h1 className="text-xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-ink-600">This address does not lead to a Fillwright page.</p>
      <a className="mt-4 inline-block font-semibold text-copper-700 underline" href="/">
        Back to my queue
      </a>
    </div>
  )
}

const router = createBrowserRouter([
  { path: paths.signIn.path, lazy: () => import('#src/features/auth/routes/sign-in.route.tsx'), errorElement: <RouteError /> },
  {
    element: <Outlet />,
    errorElement: <RouteError />,
    children: [
      {
        loader: requireUser,
        element: <AppShell />,
        errorElement: <RouteError />,
        children: [...featureRoutes, { path: '*', element: <NotFound /> }],
      },
    ],
  },
])

export function AppRouter() {
  return <RouterProvider router={router} />
}
