import { readAloudSchema, rehearsalCreateSchema } from '../../shared/schemas/rehearsal'
import type { Db } from '../db/knex'
import { addRehearsal, readAloud, rehearsalsOf, removeRehearsal } from '../services/rehearsals'
import { Download, type EndpointTable } from './endpoint'

const take = '/channels/:channelId/outlines/:outlineId'
const rehearsals = `${take}/rehearsals`

/** A take's rehearsal runs (list, save, discard) and its read-aloud preview. */
export function rehearsalEndpoints(api: EndpointTable, db: Db): void {
  api.add({ method: 'get', path: rehearsals, access: 'rehearsal.read' }, ({ params, user }) => rehearsalsOf(db, params.channelId, params.outlineId, user))
  api.add({ method: 'post', path: rehearsals, access: 'rehearsal.run', body: rehearsalCreateSchema, status: 201 }, ({ params, body, user }) =>
    addRehearsal(db, params.channelId, params.outlineId, body, user),
  )
  api.add({ method: 'delete', path: `${rehearsals}/:rehearsalId`, access: 'rehearsal.run' }, ({ params }) =>
    removeRehearsal(db, params.channelId, params.outlineId, params.rehearsalId),
  )
  api.add({ method: 'post', path: `${take}/read-aloud`, access: 'rehearsal.run', body: readAloudSchema }, async ({ params, body, user }) => {
    const wav = await readAloud(db, params.channelId, params.outlineId, body, user)
    return new Download(`read-aloud-preview-${params.outlineId}.wav`, 'audio/wav', wav)
  })
}
