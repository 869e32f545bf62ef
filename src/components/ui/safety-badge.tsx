import { cn } from '#src/lib/cn.ts'

export type SafetyState = 'blocked' | 'caution' | 'clear'

const styles: Record<SafetyState, { cls: string; word: string; icon: string }> = {
  blocked: { cls: 'bg-blocked-bg text-blocked-fg border-blocked-border', word: 'Blocked', icon: 'M6 6l12 12M18 6L6 18' },
  caution: { cls: 'bg-caution-bg text-caution-fg border-caution-border', word: 'Caution', icon: 'M12 4l9 16H3z M12 10v4 M12 17v.5' },
  clear: { cls: 'bg-clear-bg text-clear-fg border-clear-border', word: 'Clear', icon: 'M5 12l5 5 9-10' },
}

/** A safety state always shows an icon and a word as well as its colour. */
export function SafetyBadge({ state, label, className }: { state: SafetyState; label?: string; className?: string }) {
  const s = styles[state]
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded border px-2 py-0.5 text-xs font-semibold', s.cls, className)}>
      <svg
        aria-hidden="true"
        viewBox="0 0 24 24"
        className="size-3.5"
        fill="none"
        stroke="currentColor"
        strokeWidth={2.5}
        strokeLinecap="round"
        strokeLinejoin="round"
      >
        <path d={s.icon} />
      </svg>
      {label ?? s.word}
    </span>
  )
}

export function severityToState(severity: 'block' | 'caution' | 'info'): SafetyState {
  return severity === 'block' ? 'blocked' : severity === 'caution' ? 'caution' : 'clear'
}
