import { channelInputSchema } from '../../shared/schemas/team'
import type { Db } from '../db/knex'
import { channelOf, channelsOf, createChannel, membersOf, renameChannel } from '../services/channels'
import type { EndpointTable } from './endpoint'

export function channelEndpoints(api: EndpointTable, db: Db): void {
  api.add({ method: 'get', path: '/channels', access: 'signed-in' }, ({ user }) => channelsOf(db, user.id))
  api.add({ method: 'get', path: '/channels/:channelId', access: 'channel.read' }, ({ params, user }) => channelOf(db, user.id, params.channelId))
  api.add({ method: 'post', path: '/channels', access: 'signed-in', body: channelInputSchema, status: 201 }, ({ body, user }) => createChannel(db, user.id, body))
  api.add({ method: 'patch', path: '/channels/:channelId', access: 'channel.manage', body: channelInputSchema }, ({ params, body, user }) => renameChannel(db, user.id, params.channelId, body))
  api.add({ method: 'get', path: '/channels/:channelId/members', access: 'members.read' }, ({ params }) => membersOf(db, params.channelId))
}
