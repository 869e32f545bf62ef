/** Fillwright's mark: a cylinder shoulder with a fill line, in copper on ink. */
export function Logo({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect width="32" height="32" rx="7" fill="#2b313b" />
      <path d="M11 6h10v3h-2v2.2a8 8 0 0 1 5 7.4V26a2 2 0 0 1-2 2H10a2 2 0 0 1-2-2v-7.4a8 8 0 0 1 5-7.4V9h-2z" fill="#cf7a4b" />
      <path d="M10 20h12v2H10z" fill="#2b313b" />
    </svg>
  )
}
