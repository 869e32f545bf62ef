import { type Cylinder, CYLINDER_STATUS_LABEL, type CylinderStatus } from '#shared/schemas/cylinder.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'

/** Whether the cylinder may be used: Blocked (test overdue, held back, retired), test due soon, or clear — icon, word and colour. */
export function UsabilityBadge({ cylinder }: { cylinder: Pick<Cylinder, 'blocked' | 'blockReason' | 'testState'> }) {
  if (cylinder.blocked) return <SafetyBadge state="blocked" label="Blocked" />
  if (cylinder.testState === 'due-soon') return <SafetyBadge state="caution" label="Test due soon" />
  return <SafetyBadge state="clear" label="In test" />
}

export function CylinderStatusText({ status }: { status: CylinderStatus }) {
  return <span className="whitespace-nowrap text-ink-800">{CYLINDER_STATUS_LABEL[status]}</span>
}

export function residualText(c: Pick<Cylinder, 'residual'>): string {
  const r = c.residual
  if (r.kind === 'evacuated') return 'Evacuated'
  const gases = r.composition.map((x) => x.gas).join(', ')
  return `${r.pressureBarGauge} bar (gauge)${gases ? ` of ${gases}` : ''}`
}
