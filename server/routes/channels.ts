import type { Db } from '../db/knex'
import { channelOf, channelsOf, membersOf } from '../services/channels'
import type { EndpointTable } from './endpoint'

export function channelEndpoints(api: EndpointTable, db: Db): void {
  api.add({ method: 'get', path: '/channels', access: 'signed-in' }, ({ user }) => channelsOf(db, user.id))
  api.add({ method: 'get', path: '/channels/:channelId', access: 'channel.read' }, ({ params, user }) => channelOf(db, user.id, params.channelId))
  api.add({ method: 'get', path: '/channels/:channelId/members', access: 'members.read' }, ({ params }) => membersOf(db, params.channelId))
}
