import { GroupMember, GroupSummary, InvitationPreview, InvitationSummary, type GroupRole, type InviteBody } from '@shared/api/groups'
import { z } from 'zod'
import { api } from './client'

const Members = z.object({ members: z.array(GroupMember) })
const base = (groupId: string) => `/groups/${encodeURIComponent(groupId)}`

export const listMyGroups = () => api.get('/groups', { schema: z.object({ groups: z.array(GroupSummary) }) })
export const createGroup = (name: string) => api.post('/groups', { name }, { schema: GroupSummary })
export const getGroup = (groupId: string) => api.get(base(groupId), { schema: GroupSummary })
export const renameGroup = (groupId: string, name: string) => api.patch(base(groupId), { name }, { schema: GroupSummary })

export const listMembers = (groupId: string) => api.get(`${base(groupId)}/members`, { schema: Members })
export const changeRole = (groupId: string, userId: string, role: GroupRole) =>
  api.patch(`${base(groupId)}/members/${encodeURIComponent(userId)}`, { role }, { schema: Members })
export const removeMember = (groupId: string, userId: string) => api.delete(`${base(groupId)}/members/${encodeURIComponent(userId)}`)

export const listInvitations = (groupId: string) =>
  api.get(`${base(groupId)}/invitations`, { schema: z.object({ invitations: z.array(InvitationSummary) }) })
export const inviteMember = (groupId: string, body: InviteBody) =>
  api.post(`${base(groupId)}/invitations`, body, { schema: InvitationSummary.extend({ mailed: z.boolean() }) })
export const withdrawInvitation = (groupId: string, invitationId: string) =>
  api.delete(`${base(groupId)}/invitations/${encodeURIComponent(invitationId)}`)

export const previewInvitation = (token: string) => api.post('/invitations/preview', { token }, { schema: InvitationPreview })
export const acceptInvitation = (token: string) =>
  api.post('/invitations/accept', { token }, { schema: z.object({ groupId: z.string(), role: z.enum(['owner', 'editor', 'viewer']) }) })
