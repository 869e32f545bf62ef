import { useNavigate } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { Card, PageHeader } from '#src/components/ui/states.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { useCreateCylinder } from '../api/create-cylinder.ts'
import { CylinderForm } from '../components/cylinder-form.tsx'

export function Component() {
  const navigate = useNavigate()
  const create = useCreateCylinder()
  return (
    <div className="max-w-4xl">
      <PageHeader title="Add a cylinder" subtitle="Copy the markings from the cylinder shoulder: serial, water volume, service and test pressure, last test." />
      <Card>
        <CylinderForm
          cylinder={null}
          pending={create.isPending}
          error={create.error}
          onSubmit={(values, setFieldError) =>
            create.mutate(values, {
              onSuccess: (c) => navigate(paths.cylinders.detail.href(c.id)),
              onError: (err) => {
                if (err instanceof ApiError) for (const [f, m] of Object.entries(err.fieldErrors())) setFieldError(f, m)
              },
            })
          }
        />
      </Card>
    </div>
  )
}
