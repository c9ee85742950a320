import { invitationInputSchema, memberRoleSchema } from '../../shared/schemas/team'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import { changeMemberRole, removeMember } from '../services/channels'
import { invite, openInvitationsOf, withdrawInvitation } from '../services/invitations'
import type { EndpointTable } from './endpoint'

/** A channel's people: roles, removal, leaving, and the invitations its owners send. */
export function memberEndpoints(api: EndpointTable, db: Db, config: Config): void {
  const members = '/channels/:channelId/members/:userId'
  api.add({ method: 'patch', path: members, access: 'members.manage', body: memberRoleSchema }, ({ params, body }) => changeMemberRole(db, params.channelId, params.userId, body.role))
  api.add({ method: 'delete', path: members, access: 'members.manage' }, ({ params }) => removeMember(db, params.channelId, params.userId))
  // any member may leave; the last owner is kept from it
  api.add({ method: 'delete', path: '/channels/:channelId/membership', access: 'channel.read' }, ({ params, user }) => removeMember(db, params.channelId, user.id, true))

  const invitations = '/channels/:channelId/invitations'
  api.add({ method: 'get', path: invitations, access: 'members.manage' }, ({ params }) => openInvitationsOf(db, params.channelId))
  api.add({ method: 'post', path: invitations, access: 'members.manage', body: invitationInputSchema, status: 201 }, ({ params, body, user }) =>
    invite(db, config.mail, user, params.channelId, body),
  )
  api.add({ method: 'delete', path: `${invitations}/:invitationId`, access: 'members.manage' }, ({ params }) => withdrawInvitation(db, params.channelId, params.invitationId))
}
