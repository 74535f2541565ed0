import type { AuthResponse, Invitation, Member, Membership, MeResponse, Role, TeamResponse } from '../../shared/schemas/auth'
import { AcceptInvitationResponseSchema, AuthResponseSchema, InvitationResponseSchema, InvitationsResponseSchema, MembersResponseSchema, MeResponseSchema, TeamResponseSchema } from '../../shared/schemas/auth'
import { api, setAccessToken } from './client'

async function startSession(path: string, body: unknown): Promise<AuthResponse> {
  const session = await api('POST', path, { body, schema: AuthResponseSchema })
  setAccessToken(session.accessToken)
  return session
}

export const signIn = (email: string, password: string): Promise<AuthResponse> => startSession('/auth/login', { email, password })
export const signUp = (name: string, email: string, password: string): Promise<AuthResponse> => startSession('/auth/register', { name, email, password })

export async function signOut(): Promise<void> {
  try {
    await api('POST', '/auth/logout')
  }
  finally {
    setAccessToken(null)
  }
}

export async function requestPasswordReset(email: string): Promise<void> {
  await api('POST', '/auth/password-reset/request', { body: { email } })
}
export async function confirmPasswordReset(token: string, password: string): Promise<void> {
  await api('POST', '/auth/password-reset/confirm', { body: { token, password } })
}

export const fetchMe = (): Promise<MeResponse> => api('GET', '/me', { schema: MeResponseSchema })
export const createTeam = (name: string): Promise<TeamResponse> => api('POST', '/teams', { body: { name }, schema: TeamResponseSchema })

export const fetchMembers = async (teamId: string): Promise<Member[]> => (await api('GET', `/teams/${teamId}/members`, { schema: MembersResponseSchema })).members
export async function changeRole(teamId: string, userId: string, role: Role): Promise<Member[]> {
  return (await api('PATCH', `/teams/${teamId}/members/${userId}`, { body: { role }, schema: MembersResponseSchema })).members
}
export async function removeMember(teamId: string, userId: string): Promise<void> {
  await api('DELETE', `/teams/${teamId}/members/${userId}`)
}

export const fetchInvitations = async (teamId: string): Promise<Invitation[]> => (await api('GET', `/teams/${teamId}/invitations`, { schema: InvitationsResponseSchema })).invitations
export async function invite(teamId: string, email: string, role: Role): Promise<Invitation> {
  return (await api('POST', `/teams/${teamId}/invitations`, { body: { email, role }, schema: InvitationResponseSchema })).invitation
}
export async function withdrawInvitation(teamId: string, invitationId: string): Promise<void> {
  await api('DELETE', `/teams/${teamId}/invitations/${invitationId}`)
}
export const acceptInvitation = async (token: string): Promise<Membership> => (await api('POST', '/invitations/accept', { body: { token }, schema: AcceptInvitationResponseSchema })).membership
