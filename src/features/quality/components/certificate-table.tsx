import type { CertificateSummary } from '#shared/schemas/quality.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { cn } from '#src/lib/cn.ts'
import { certificatePdfHref } from '../api/quality-queries.ts'

/** Certificates with every revision: the newest revision of a number is current, older ones say what replaced them. */
export function CertificateTable({
  certificates,
  showCustomer,
  selectedId,
  onSelect,
}: {
  certificates: CertificateSummary[]
  showCustomer: boolean
  selectedId?: number | null
  onSelect?: (c: CertificateSummary) => void
}) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">Certificates of composition and their revisions</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-3">
              Certificate
            </th>
            <th scope="col" className="py-2 pr-3">
              Status
            </th>
            {showCustomer && (
              <th scope="col" className="py-2 pr-3">
                Customer
              </th>
            )}
            <th scope="col" className="py-2 pr-3">
              Order · cylinder
            </th>
            <th scope="col" className="py-2 pr-3">
              Released
            </th>
            <th scope="col" className="py-2 pr-3">
              Valid until
            </th>
            <th scope="col" className="py-2">
              PDF
            </th>
          </tr>
        </thead>
        <tbody>
          {certificates.map((c) => (
            <tr key={c.id} className={cn('border-b border-ink-100 align-top', selectedId === c.id && 'bg-copper-50')}>
              <th scope="row" className="py-2 pr-3 text-left font-normal">
                {onSelect ? (
                  <button
                    type="button"
                    className="num whitespace-nowrap font-mono text-xs font-semibold text-ink-900 hover:underline"
                    onClick={() => onSelect(c)}
                    aria-pressed={selectedId === c.id}
                  >
                    {c.number} rev. {c.revision}
                  </button>
                ) : (
                  <span className="num whitespace-nowrap font-mono text-xs font-semibold">
                    {c.number} rev. {c.revision}
                  </span>
                )}
                <span className="block text-xs text-ink-600">{c.description}</span>
              </th>
              <td className="py-2 pr-3">
                {c.current ? (
                  <SafetyBadge state="clear" label="Current" />
                ) : (
                  <SafetyBadge state="caution" label={`Superseded by rev. ${c.supersededByRevision}`} />
                )}
                {c.correctionReason && <span className="mt-1 block max-w-xs text-xs text-ink-600">Correction: {c.correctionReason}</span>}
              </td>
              {showCustomer && <td className="py-2 pr-3">{c.customerCompany}</td>}
              <td className="py-2 pr-3">
                {c.orderNumber}
                <span className="block font-mono text-xs text-ink-600">{c.cylinderSerial}</span>
              </td>
              <td className="num whitespace-nowrap py-2 pr-3">{c.releasedAt.slice(0, 10)}</td>
              <td className="num whitespace-nowrap py-2 pr-3">{c.validUntil}</td>
              <td className="py-2">
                <a
                  className="font-semibold text-copper-700 underline"
                  href={certificatePdfHref(c.id)}
                  aria-label={`Download ${c.number} revision ${c.revision} (PDF, A4)`}
                >
                  Download
                </a>
                <a
                  className="mt-1 flex min-h-6 items-center text-xs text-ink-700 underline"
                  href={certificatePdfHref(c.id, 'letter')}
                  aria-label={`Download ${c.number} revision ${c.revision} (PDF, US Letter)`}
                >
                  US Letter
                </a>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}
