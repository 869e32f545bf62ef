import type { Hazard } from '#shared/schemas/quality.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'

/** The cylinder's hazard statement and the usual cautions, as the certificate prints them: never behind a click. */
export function HazardBox({ hazard }: { hazard: Hazard }) {
  return (
    <section aria-label="Hazard statement and cautions" className="rounded-md border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg">
      <div className="flex items-start gap-2">
        <SafetyBadge state="caution" />
        <p className="font-medium">{hazard.statement}</p>
      </div>
      <ul className="mt-2 list-disc space-y-0.5 pl-5">
        {hazard.cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  )
}
