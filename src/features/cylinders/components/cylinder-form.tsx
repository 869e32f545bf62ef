import { zodResolver } from '@hookform/resolvers/zod'
import { useQuery } from '@tanstack/react-query'
import { useForm } from 'react-hook-form'
import {
  CYLINDER_MATERIALS,
  CYLINDER_STATUS_LABEL,
  type Cylinder,
  type CylinderInput,
  type CylinderInputParsed,
  CylinderInputSchema,
  MANUAL_CYLINDER_STATUSES,
} from '#shared/schemas/cylinder.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Field, Input, inputClass, Select } from '#src/components/ui/field.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { cn } from '#src/lib/cn.ts'
import { cylinderQueries } from '../api/cylinder-queries.ts'

const FIELDS = [
  'serial',
  'barcode',
  'waterVolumeL',
  'servicePressureBar',
  'testPressureBar',
  'material',
  'valveOutlet',
  'oxygenClean',
  'ownerId',
  'lastTestDate',
  'nextTestDate',
  'status',
  'notes',
] as const
type FieldName = (typeof FIELDS)[number]

const manual = (s: string): s is (typeof MANUAL_CYLINDER_STATUSES)[number] => (MANUAL_CYLINDER_STATUSES as readonly string[]).includes(s)

function defaultsOf(c: Cylinder | null): CylinderInput {
  if (!c) {
    return {
      serial: '',
      barcode: '',
      waterVolumeL: 50,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'steel',
      valveOutlet: '',
      oxygenClean: false,
      ownerId: null,
      lastTestDate: '',
      nextTestDate: '',
      notes: '',
      status: 'available',
      residual: { kind: 'evacuated' },
    }
  }
  return {
    serial: c.serial,
    barcode: c.barcode,
    waterVolumeL: c.waterVolumeL,
    servicePressureBar: c.servicePressureBar,
    testPressureBar: c.testPressureBar,
    material: c.material,
    valveOutlet: c.valveOutlet,
    oxygenClean: c.oxygenClean,
    ownerId: c.ownerId,
    lastTestDate: c.lastTestDate,
    nextTestDate: c.nextTestDate,
    notes: c.notes,
    status: manual(c.status) ? c.status : 'available',
    residual: c.residual,
  }
}

/**
 * Create or edit a cylinder. The same zod schema checks the form here and the request on the server; the server's
 * field errors (a serial already taken, say) land next to their fields.
 */
export function CylinderForm({
  cylinder,
  pending,
  error,
  onSubmit,
}: {
  cylinder: Cylinder | null
  pending: boolean
  error: unknown
  onSubmit: (values: CylinderInputParsed, setFieldError: (field: string, message: string) => void) => void
}) {
  const owners = useQuery(cylinderQueries.owners())
  const form = useForm<CylinderInput, unknown, CylinderInputParsed>({ resolver: zodResolver(CylinderInputSchema), defaultValues: defaultsOf(cylinder) })
  const { errors } = form.formState
  const workflowState = cylinder && !manual(cylinder.status) ? cylinder.status : null
  const setFieldError = (field: string, message: string) => {
    if ((FIELDS as readonly string[]).includes(field)) form.setError(field as FieldName, { message })
  }
  const submit = form.handleSubmit((values) => onSubmit(values, setFieldError))
  const serverError =
    error instanceof ApiError
      ? error.body.errors?.length
        ? null
        : error.body.detail
      : error
        ? 'Could not reach the server; nothing was saved. Try again.'
        : null
  const num = { valueAsNumber: true } as const

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={cylinder ? `Edit cylinder ${cylinder.serial}` : 'New cylinder'}>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Serial number" error={errors.serial?.message}>
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.serial} autoComplete="off" {...form.register('serial')} />}
        </Field>
        <Field label="Barcode" error={errors.barcode?.message} hint="Printed on the label as Code 128; scan it at the manifold">
          {(id, d) => (
            <Input id={id} aria-describedby={d} aria-invalid={!!errors.barcode} autoComplete="off" className="font-mono" {...form.register('barcode')} />
          )}
        </Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Water volume (L)" error={errors.waterVolumeL?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.waterVolumeL}
              inputMode="decimal"
              type="number"
              step="any"
              {...form.register('waterVolumeL', num)}
            />
          )}
        </Field>
        <Field label="Service pressure (bar, gauge, 15 °C)" error={errors.servicePressureBar?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.servicePressureBar}
              inputMode="decimal"
              type="number"
              step="any"
              {...form.register('servicePressureBar', num)}
            />
          )}
        </Field>
        <Field label="Test pressure (bar, gauge)" error={errors.testPressureBar?.message}>
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.testPressureBar}
              inputMode="decimal"
              type="number"
              step="any"
              {...form.register('testPressureBar', num)}
            />
          )}
        </Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Material" error={errors.material?.message}>
          {(id, d) => (
            <Select id={id} aria-describedby={d} {...form.register('material')}>
              {CYLINDER_MATERIALS.map((m) => (
                <option key={m} value={m}>
                  {m}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Valve outlet" error={errors.valveOutlet?.message} hint="e.g. DIN 477 No. 10">
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.valveOutlet} {...form.register('valveOutlet')} />}
        </Field>
        <Field label="Owner" error={errors.ownerId?.message}>
          {(id, d) => (
            <Select id={id} aria-describedby={d} {...form.register('ownerId', { setValueAs: (v) => (v === '' || v === null ? null : Number(v)) })}>
              <option value="">The shop</option>
              {(owners.data ?? []).map((o) => (
                <option key={o.id} value={o.id}>
                  {o.code} · {o.company}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Last periodic test" error={errors.lastTestDate?.message}>
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.lastTestDate} type="date" {...form.register('lastTestDate')} />}
        </Field>
        <Field label="Next periodic test due" error={errors.nextTestDate?.message} hint="After this date the cylinder is blocked from filling">
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.nextTestDate} type="date" {...form.register('nextTestDate')} />}
        </Field>
        {workflowState ? (
          <div className="flex flex-col gap-1">
            <span className="text-sm font-medium text-ink-800">State</span>
            <p className="min-h-10 content-center text-sm text-ink-700">{CYLINDER_STATUS_LABEL[workflowState]} (follows the work)</p>
          </div>
        ) : (
          <Field label="State" error={errors.status?.message}>
            {(id, d) => (
              <Select id={id} aria-describedby={d} {...form.register('status')}>
                {MANUAL_CYLINDER_STATUSES.map((s) => (
                  <option key={s} value={s}>
                    {CYLINDER_STATUS_LABEL[s]}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        )}
      </div>
      <label className="flex min-h-10 items-center gap-2 text-sm font-medium text-ink-800">
        <input type="checkbox" className="size-5" {...form.register('oxygenClean')} />
        Oxygen-clean (cylinder and valve cleaned for oxygen service)
      </label>
      <Field label="Notes" error={errors.notes?.message}>
        {(id, d) => <textarea id={id} rows={2} aria-describedby={d} className={cn(inputClass, 'py-2')} {...form.register('notes')} />}
      </Field>
      {serverError && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {serverError}
        </p>
      )}
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : cylinder ? 'Save changes' : 'Add cylinder'}
      </Button>
    </form>
  )
}
