// Forms and routes of signing in, signing up, invitations and resets share these schemas.
import { z } from 'zod'
import { ROLES } from '../kerf/roles'

export const Email = z.string().trim().toLowerCase().max(254).pipe(z.email({ error: 'enter a valid e-mail address' }))
export const Password = z.string()
  .min(10, { error: 'use at least 10 characters' })
  .max(200, { error: 'use at most 200 characters' })
export const PersonName = z.string().trim().min(1, { error: 'enter a name' }).max(120, { error: 'use at most 120 characters' })
export const Token = z.string().regex(/^[\w-]{20,100}$/, { error: 'this link is not complete: open it again from the e-mail' })

export const LoginBody = z.object({
  email: Email,
  // Not the new-password rule: old or odd passwords must still get a plain "wrong password".
  password: z.string().min(1, { error: 'enter your password' }).max(200),
})

export const SignupBody = z.object({
  shopName: z.string().trim().min(1, { error: 'enter the shop\'s name' }).max(120),
  name: PersonName,
  email: Email,
  password: Password,
})

export const InvitationBody = z.object({
  email: Email,
  name: PersonName,
  role: z.enum(ROLES, { error: 'choose operator, crib manager or owner' }),
})

export const AcceptInvitationBody = z.object({ token: Token, password: Password, name: PersonName.optional() })
export const ResetRequestBody = z.object({ email: Email })
export const ResetBody = z.object({ token: Token, password: Password })
export const ConfirmEmailBody = z.object({ token: Token })

export const MeUpdateBody = z.object({
  name: PersonName.optional(),
  lengthUnit: z.enum(['mm', 'in']).optional(),
})

export const UserUpdateBody = z.object({
  role: z.enum(ROLES).optional(),
  active: z.boolean().optional(),
})

export const PasswordChangeBody = z.object({
  currentPassword: z.string({ error: 'enter your current password' }).min(1, { error: 'enter your current password' }).max(200, { error: 'use at most 200 characters' }),
  newPassword: Password,
}).refine((b) => b.currentPassword !== b.newPassword, { error: 'choose a password different from the current one', path: ['newPassword'] })
