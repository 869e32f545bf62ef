import type { ReactNode } from 'react'

/**
 * A horizontally scrollable wrapper for wide tables. It takes keyboard focus so the part out of view can be
 * scrolled without a mouse (WCAG 2.1.1; axe rule scrollable-region-focusable).
 */
export function ScrollRegion({ label, children }: { label: string; children: ReactNode }) {
  return (
    // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrollable region must be reachable from the keyboard
    <section className="overflow-x-auto focus-visible:outline-2" tabIndex={0} aria-label={label}>
      {children}
    </section>
  )
}
