import type { ButtonHTMLAttributes } from 'react'
import { cn } from '#src/lib/cn.ts'

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger'
const variants: Record<Variant, string> = {
  primary: 'bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-300',
  secondary: 'bg-white text-ink-800 border border-ink-300 hover:bg-ink-100 disabled:text-ink-400',
  ghost: 'text-ink-700 hover:bg-ink-100',
  danger: 'bg-blocked-solid text-white hover:brightness-95 disabled:bg-ink-300',
}

export function Button({
  variant = 'primary',
  size = 'md',
  className,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; size?: 'md' | 'lg' | 'sm' }) {
  return (
    <button
      type="button"
      {...props}
      className={cn(
        'inline-flex items-center justify-center gap-2 rounded-md font-medium transition-colors disabled:cursor-not-allowed',
        size === 'lg' ? 'min-h-14 px-6 text-lg' : size === 'sm' ? 'min-h-8 px-2.5 text-sm' : 'min-h-10 px-4 text-sm',
        variants[variant],
        className,
      )}
    />
  )
}
