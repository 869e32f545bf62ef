import type { PlanWarningSchema } from '#shared/schemas/fill-plan.ts'
import type { StandingCaution } from '#shared/schemas/plan-cautions.ts'
import { SafetyBadge, severityToState } from '#src/components/ui/safety-badge.tsx'
import type { z } from 'zod'

type Warning = z.infer<typeof PlanWarningSchema>

const WORD = { block: 'Blocked', caution: 'Caution', info: 'Note' } as const

/** One finding with its caution in plain words: never hidden behind a click. */
export function Finding({ warning }: { warning: Warning }) {
  return (
    <li className="flex flex-wrap items-start gap-2 text-sm">
      <SafetyBadge state={severityToState(warning.severity)} label={WORD[warning.severity]} />
      <span className="min-w-0 flex-1">
        {warning.message}
        {warning.caution && <span className="mt-0.5 block text-xs font-medium text-ink-700">{warning.caution}</span>}
      </span>
    </li>
  )
}

/** Findings that concern the whole plan (those about one step sit next to that step in the steps table). */
export function GeneralFindings({ warnings }: { warnings: Warning[] }) {
  const general = warnings.filter((w) => w.step === undefined)
  if (!general.length) return null
  const order = { block: 0, caution: 1, info: 2 }
  return (
    <ul className="space-y-2" aria-label="Findings about the whole plan">
      {[...general]
        .sort((a, b) => order[a.severity] - order[b.severity])
        .map((w, i) => (
          <Finding key={`${w.code}-${i}`} warning={w} />
        ))}
    </ul>
  )
}

/** The usual cautions for the gases of this plan (high pressure always). */
export function StandingCautions({ cautions }: { cautions: StandingCaution[] }) {
  return (
    <section aria-label="Cautions" className="space-y-2">
      {cautions.map((c) => (
        <div key={c.key} className="flex flex-wrap items-start gap-2 rounded-card border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg">
          <SafetyBadge state="caution" label={c.title} />
          <span className="min-w-0 flex-1">{c.text}</span>
        </div>
      ))}
    </section>
  )
}
