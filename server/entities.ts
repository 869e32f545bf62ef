import { AuditEventSchema } from './modules/audit/audit-event.entity.ts'
import { SessionSchema } from './modules/auth/session.entity.ts'
import { CustomerSchema } from './modules/customers/customer.entity.ts'
import { CylinderSchema } from './modules/cylinders/cylinder.entity.ts'
import { UserSchema } from './modules/users/user.entity.ts'

/** Every entity of the app: one list read by the ORM config and the CLI. */
export const entities = [CustomerSchema, UserSchema, SessionSchema, AuditEventSchema, CylinderSchema]
