import type { StepCaution } from '#shared/schemas/run.ts'

const TITLE: Record<StepCaution['kind'], string> = {
  pressure: 'High pressure',
  oxygen: 'Oxygen',
  flammable: 'Flammable',
  toxic: 'Toxic',
  corrosive: 'Corrosive',
  'fuel-oxidiser': 'Fuel with oxidiser',
  vent: 'Venting',
  plan: 'From the plan',
}

/** The step's cautions, always shown in full (never behind a click): icon, word and text. */
export function StepCautions({ cautions }: { cautions: StepCaution[] }) {
  if (cautions.length === 0) return null
  return (
    <ul className="space-y-2" aria-label="Cautions for this step">
      {cautions.map((c, i) => (
        <li key={`${c.kind}-${i}`} className="flex gap-3 rounded-md border-2 border-caution-border bg-caution-bg px-3 py-2 text-base text-caution-fg">
          <svg
            aria-hidden="true"
            viewBox="0 0 24 24"
            className="mt-0.5 size-6 shrink-0"
            fill="none"
            stroke="currentColor"
            strokeWidth={2.5}
            strokeLinecap="round"
            strokeLinejoin="round"
          >
            <path d="M12 4l9 16H3z M12 10v4 M12 17v.5" />
          </svg>
          <p>
            <span className="font-bold">Caution — {TITLE[c.kind]}: </span>
            {c.text}
          </p>
        </li>
      ))}
    </ul>
  )
}
