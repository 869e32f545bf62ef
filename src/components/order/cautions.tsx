import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'

/** The plain-word cautions of a mixture, always visible next to it (never behind a click). */
export function Cautions({ cautions, title = 'Safety' }: { cautions: string[]; title?: string }) {
  if (cautions.length === 0) return null
  return (
    <section aria-label={title} className="rounded-md border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg">
      <SafetyBadge state="caution" label={title} className="mb-1" />
      <ul className="list-disc space-y-0.5 pl-5">
        {cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  )
}
