import { useEffect, useRef, useState } from 'react'
import { useNavigate } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { ApiError } from '#src/lib/api-client.ts'
import { lookupRunByBarcode } from '../api/run-queries.ts'

/**
 * A keyboard-wedge scanner types the barcode and presses Enter: the field finds the open fill of that cylinder
 * assigned to you and opens it. Typing the barcode by hand works the same way.
 */
export function ScanField({ autoFocus = false }: { autoFocus?: boolean }) {
  const navigate = useNavigate()
  const [code, setCode] = useState('')
  const [message, setMessage] = useState<string | null>(null)
  const [busy, setBusy] = useState(false)
  const input = useRef<HTMLInputElement>(null)
  // on the fills page the scanner types straight into the field
  useEffect(() => {
    if (autoFocus) input.current?.focus()
  }, [autoFocus])
  const open = async () => {
    const barcode = code.trim()
    if (!barcode) return
    setBusy(true)
    setMessage(null)
    try {
      const run = await lookupRunByBarcode(barcode)
      setCode('')
      navigate(paths.runs.detail.href(run.id))
    } catch (err) {
      setMessage(err instanceof ApiError ? err.body.detail : 'Could not reach the server. Check the connection and scan again.')
    } finally {
      setBusy(false)
    }
  }
  return (
    <form
      className="flex flex-col gap-2 sm:flex-row sm:items-end"
      onSubmit={(e) => {
        e.preventDefault()
        void open()
      }}
    >
      <label className="flex flex-1 flex-col gap-1 text-base font-semibold text-ink-900">
        Scan or type a cylinder barcode
        <input
          value={code}
          onChange={(e) => setCode(e.target.value)}
          ref={input}
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          aria-describedby={message ? 'scan-message' : undefined}
          className="min-h-14 rounded-md border-2 border-ink-400 bg-white px-4 font-mono text-xl text-ink-950 focus:border-copper-600"
          placeholder="FW100001"
        />
      </label>
      <button
        type="submit"
        disabled={busy || !code.trim()}
        className="min-h-14 rounded-md bg-ink-900 px-6 text-lg font-semibold text-white disabled:bg-ink-400"
      >
        {busy ? 'Finding…' : 'Open fill'}
      </button>
      {message && (
        <p id="scan-message" role="alert" className="text-base font-medium text-blocked-fg sm:basis-full">
          {message}
        </p>
      )}
    </form>
  )
}
