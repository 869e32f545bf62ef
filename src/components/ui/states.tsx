import type { ReactNode } from 'react'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'

/** What will appear here, and how to make it appear. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-ink-300 bg-white/60 px-6 py-8 text-center">
      <p className="font-semibold text-ink-800">{title}</p>
      {children && <div className="mx-auto mt-1 max-w-prose text-sm text-ink-600">{children}</div>}
      {action && <div className="mt-4">{action}</div>}
    </div>
  )
}

export function Skeleton({ className }: { className?: string }) {
  return <div aria-hidden="true" className={cn('animate-pulse rounded bg-ink-200', className)} />
}

export function SkeletonRows({ rows = 4 }: { rows?: number }) {
  return (
    <div className="space-y-2" role="status" aria-busy="true" aria-label="Loading">
      {Array.from({ length: rows }, (_, i) => (
        <Skeleton key={i} className="h-9 w-full" />
      ))}
    </div>
  )
}

/** What happened and what to do next. */
export function ErrorState({ error, retry }: { error: unknown; retry?: () => void }) {
  const message = error instanceof ApiError ? error.body.detail : error instanceof Error ? error.message : 'Unknown error'
  return (
    <div role="alert" className="rounded-card border border-blocked-border bg-blocked-bg px-4 py-3 text-sm text-blocked-fg">
      <p className="font-semibold">Could not load this.</p>
      <p className="mt-0.5">{message}</p>
      {retry && (
        <button type="button" onClick={retry} className="mt-2 font-semibold underline">
          Try again
        </button>
      )}
    </div>
  )
}

export function Card({ title, actions, children, className }: { title?: ReactNode; actions?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={cn('rounded-card border border-ink-200 bg-white shadow-sm', className)}>
      {(title || actions) && (
        <header className="flex items-center justify-between gap-3 border-b border-ink-100 px-4 py-3">
          {title && <h2 className="text-sm font-semibold tracking-wide text-ink-800">{title}</h2>}
          {actions}
        </header>
      )}
      <div className="p-4">{children}</div>
    </section>
  )
}

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight text-ink-900">{title}</h1>
        {subtitle && <p className="mt-1 text-sm text-ink-600">{subtitle}</p>}
      </div>
      {actions && <div className="flex gap-2">{actions}</div>}
    </div>
  )
}
