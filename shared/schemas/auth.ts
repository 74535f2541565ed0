import { z } from 'zod'
import { IdSchema, nameText, storableText } from './primitives'

export { IdSchema }

export const RoleSchema = z.enum(['owner', 'lead', 'member', 'viewer'])
export type Role = z.infer<typeof RoleSchema>

export const EmailSchema = z.string({ error: 'must be an e-mail address' }).trim().toLowerCase().max(254, 'must be at most 254 characters').pipe(z.email({ error: 'must be an e-mail address' }))
/** Never trimmed; a lone surrogate would hash the same as U+FFFD, so it is refused like a NUL. */
export const PasswordSchema = storableText().min(10, 'must be at least 10 characters').max(256, 'must be at most 256 characters')
export const PersonNameSchema = nameText(120)
export const TeamNameSchema = nameText(120)
/** One-time tokens travel as 43 characters of base64url (32 random bytes). */
export const OneTimeTokenSchema = z.string({ error: 'must be text' }).regex(/^[\w-]{43}$/, 'is not a valid link token')

export const RegisterBodySchema = z.strictObject({ email: EmailSchema, password: PasswordSchema, name: PersonNameSchema })
  .refine(body => body.password.trim().toLowerCase() !== body.email, { message: 'must not be the same as the e-mail address', path: ['password'] })
export const LoginBodySchema = z.strictObject({ email: EmailSchema, password: z.string({ error: 'must be text' }).min(1, 'must not be empty').max(256, 'must be at most 256 characters') })
export const ResetRequestBodySchema = z.strictObject({ email: EmailSchema })
export const ResetConfirmBodySchema = z.strictObject({ token: OneTimeTokenSchema, password: PasswordSchema })

export const UserSchema = z.object({ id: z.string(), email: z.string(), name: z.string() })
export type User = z.infer<typeof UserSchema>

export const AuthResponseSchema = z.object({ user: UserSchema, accessToken: z.string() })
export type AuthResponse = z.infer<typeof AuthResponseSchema>

export const MembershipSchema = z.object({ teamId: z.string(), teamName: z.string(), role: RoleSchema })
export type Membership = z.infer<typeof MembershipSchema>
export const MeResponseSchema = z.object({ user: UserSchema, memberships: z.array(MembershipSchema) })
export type MeResponse = z.infer<typeof MeResponseSchema>

export const TeamBodySchema = z.strictObject({ name: TeamNameSchema })
export const TeamSchema = z.object({ id: z.string(), name: z.string(), createdAt: z.string() })
export const TeamResponseSchema = z.object({ team: TeamSchema, role: RoleSchema })
export type TeamResponse = z.infer<typeof TeamResponseSchema>

export const MemberSchema = z.object({ userId: z.string(), name: z.string(), email: z.string(), role: RoleSchema, joinedAt: z.string() })
export type Member = z.infer<typeof MemberSchema>
export const MembersResponseSchema = z.object({ members: z.array(MemberSchema) })
export const RoleBodySchema = z.strictObject({ role: RoleSchema })

export const InvitationBodySchema = z.strictObject({ email: EmailSchema, role: RoleSchema })
export const InvitationSchema = z.object({ id: z.string(), email: z.string(), role: RoleSchema, expiresAt: z.string(), createdAt: z.string() })
export type Invitation = z.infer<typeof InvitationSchema>
export const InvitationResponseSchema = z.object({ invitation: InvitationSchema })
export const InvitationsResponseSchema = z.object({ invitations: z.array(InvitationSchema) })
export const AcceptInvitationBodySchema = z.strictObject({ token: OneTimeTokenSchema })
export const AcceptInvitationResponseSchema = z.object({ membership: MembershipSchema })
