// Groups, their members and invitations, and share links.
import { z } from 'zod'
import { AcceptInvitationBody, GroupCreateBody, GroupMember, GroupSummary, GroupUpdateBody, InvitationPreview, InvitationSummary, InviteBody, RoleChangeBody } from '@shared/api/groups'
import { CreatedShareLink, ShareCreateBody, ShareLinkSummary, ShareListQuery } from '@shared/api/shares'
import type { ApiOperation } from '../registry'

const members = { status: 200, description: 'The members', schema: z.object({ members: z.array(GroupMember) }) }
const noContent = { status: 204, description: 'Done; no body' }

export const groupsOperations: ApiOperation[] = [
  { method: 'GET', path: '/api/groups', tag: 'Groups', auth: 'user', summary: 'Your groups with your role in each', response: { status: 200, description: 'Groups', schema: z.object({ groups: z.array(GroupSummary) }) } },
  { method: 'POST', path: '/api/groups', tag: 'Groups', auth: 'user', summary: 'Create a group (you become its owner)', body: GroupCreateBody, response: { status: 201, description: 'The group', schema: GroupSummary } },
  { method: 'GET', path: '/api/groups/:groupId', tag: 'Groups', auth: 'user', summary: 'One of your groups', response: { status: 200, description: 'The group', schema: GroupSummary } },
  { method: 'PATCH', path: '/api/groups/:groupId', tag: 'Groups', auth: 'user', summary: 'Rename a group (owners)', body: GroupUpdateBody, response: { status: 200, description: 'The group', schema: GroupSummary } },
  { method: 'GET', path: '/api/groups/:groupId/members', tag: 'Groups', auth: 'user', summary: 'Members of a group', response: members },
  { method: 'PATCH', path: '/api/groups/:groupId/members/:userId', tag: 'Groups', auth: 'user', summary: "Change a member's role (owners)", body: RoleChangeBody, response: members },
  { method: 'DELETE', path: '/api/groups/:groupId/members/:userId', tag: 'Groups', auth: 'user', summary: 'Remove a member, or leave the group yourself', response: noContent },
  { method: 'GET', path: '/api/groups/:groupId/invitations', tag: 'Groups', auth: 'user', summary: 'Pending invitations of a group', response: { status: 200, description: 'Invitations', schema: z.object({ invitations: z.array(InvitationSummary) }) } },
  {
    method: 'POST',
    path: '/api/groups/:groupId/invitations',
    tag: 'Groups',
    auth: 'user',
    summary: 'Invite someone by e-mail (owners)',
    body: InviteBody,
    response: { status: 201, description: 'The invitation; `mailed` says whether the mail went out', schema: InvitationSummary.extend({ mailed: z.boolean() }) },
  },
  { method: 'DELETE', path: '/api/groups/:groupId/invitations/:invitationId', tag: 'Groups', auth: 'user', summary: 'Withdraw an invitation (owners)', response: noContent },
  { method: 'POST', path: '/api/invitations/preview', tag: 'Groups', auth: 'public', summary: 'What an invitation token invites to', body: AcceptInvitationBody, response: { status: 200, description: 'The invitation', schema: InvitationPreview } },
  { method: 'POST', path: '/api/invitations/accept', tag: 'Groups', auth: 'user', summary: 'Join the group with an invitation token', body: AcceptInvitationBody, response: { status: 200, description: 'The group id and your role', contentType: 'application/json' } },

  { method: 'POST', path: '/api/shares', tag: 'Share links', auth: 'user', summary: 'Create a read-only share link to a run or sweep', body: ShareCreateBody, response: { status: 201, description: 'The link with its token', schema: CreatedShareLink } },
  { method: 'GET', path: '/api/shares', tag: 'Share links', auth: 'user', summary: 'Share links of one resource', query: ShareListQuery, response: { status: 200, description: 'Links', schema: z.object({ shares: z.array(ShareLinkSummary) }) } },
  { method: 'DELETE', path: '/api/shares/:id', tag: 'Share links', auth: 'user', summary: 'Revoke a share link', response: { status: 200, description: 'The revoked link', schema: ShareLinkSummary } },
]
