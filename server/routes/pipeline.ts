import { auditQuerySchema, cadenceUpdateSchema, notificationChoicesSchema, notificationsReadSchema, stageMoveSchema, takePlanSchema } from '../../shared/schemas/pipeline'
import type { Db } from '../db/knex'
import { auditOf } from '../services/audit'
import { markNotificationsRead, notificationChoicesOf, notificationsOf, saveNotificationChoices } from '../services/notifications'
import { boardOf, changeCadence, moveTake, planTake } from '../services/pipeline'
import type { EndpointTable } from './endpoint'

const take = '/channels/:channelId/outlines/:outlineId'

/** The episode pipeline: the board, stage moves and plans, the cadence, the audit log, and each person's notifications. */
export function pipelineEndpoints(api: EndpointTable, db: Db): void {
  api.add({ method: 'get', path: '/channels/:channelId/board', access: 'pipeline.read' }, ({ params }) => boardOf(db, params.channelId))
  api.add({ method: 'put', path: `${take}/stage`, access: 'pipeline.move', body: stageMoveSchema }, ({ params, body, user }) =>
    moveTake(db, params.channelId, params.outlineId, body.stage, user),
  )
  api.add({ method: 'put', path: `${take}/plan`, access: 'pipeline.plan', body: takePlanSchema }, ({ params, body, user }) => planTake(db, params.channelId, params.outlineId, body, user))
  api.add({ method: 'put', path: '/channels/:channelId/cadence', access: 'channel.manage', body: cadenceUpdateSchema }, ({ params, body, user }) =>
    changeCadence(db, params.channelId, body, user),
  )
  api.add({ method: 'get', path: '/channels/:channelId/audit', access: 'audit.read', query: auditQuerySchema }, ({ params, query }) => auditOf(db, params.channelId, query))

  api.add({ method: 'get', path: '/notifications', access: 'signed-in' }, ({ user }) => notificationsOf(db, user.id))
  api.add({ method: 'post', path: '/notifications/read', access: 'signed-in', body: notificationsReadSchema }, async ({ body, user }) => {
    await markNotificationsRead(db, user.id, body)
  })
  api.add({ method: 'get', path: '/notification-choices', access: 'signed-in' }, ({ user }) => notificationChoicesOf(db, user.id))
  api.add({ method: 'put', path: '/notification-choices', access: 'signed-in', body: notificationChoicesSchema }, ({ body, user }) => saveNotificationChoices(db, user.id, body))
}
