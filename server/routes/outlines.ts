import { cueSheetQuerySchema, outlineCreateSchema, outlineRefreshSchema, outlineSaveSchema } from '../../shared/schemas/studio'
import type { Db } from '../db/knex'
import { cueSheetOf } from '../services/cue-sheets'
import { duplicateOutline, makeOutline, outlineJsonOf, outlinesOf, outlineTagOf, refreshOutline, removeOutline, saveOutline } from '../services/outlines'
import type { Engine } from '../workers/engine-pool'
import type { Exports } from '../workers/export-pool'
import { Download, Revalidated, type EndpointTable } from './endpoint'

const takes = '/channels/:channelId/puzzles/:puzzleId/outlines'
const outline = '/channels/:channelId/outlines/:outlineId'

/** A puzzle's outlines (takes), and each outline by its id within the channel. */
export function outlineEndpoints(api: EndpointTable, db: Db, engine: Engine & Exports): void {
  api.add({ method: 'get', path: takes, access: 'outline.read' }, ({ params }) => outlinesOf(db, params.channelId, params.puzzleId))
  api.add({ method: 'post', path: takes, access: 'outline.create', body: outlineCreateSchema, status: 201 }, ({ params, body, user }) =>
    makeOutline(db, engine, params.channelId, params.puzzleId, body, user),
  )
  // a browser revalidating an unchanged outline gets a 304 from one small query, the document never loaded
  api.add({ method: 'get', path: outline, access: 'outline.read' }, async ({ params }) => {
    const tag = await outlineTagOf(db, params.channelId, params.outlineId)
    return new Revalidated(tag, () => outlineJsonOf(db, params.channelId, params.outlineId))
  })
  // editors edit the lines of a take; making and removing takes is for owners and presenters
  api.add({ method: 'patch', path: outline, access: 'outline.edit', body: outlineSaveSchema }, ({ params, body, user }) =>
    saveOutline(db, params.channelId, params.outlineId, body, user),
  )
  api.add({ method: 'get', path: `${outline}/cue-sheet.pdf`, access: 'outline.read', query: cueSheetQuerySchema }, async ({ params, query }) => {
    const { filename, pdf } = await cueSheetOf(db, engine, params.channelId, params.outlineId, query.thumbnails)
    return new Download(filename, 'application/pdf', pdf)
  })
  api.add({ method: 'post', path: `${outline}/duplicate`, access: 'outline.create', status: 201 }, ({ params, user }) =>
    duplicateOutline(db, params.channelId, params.outlineId, user),
  )
  // finding the path again remakes the take's steps, as making one does
  api.add({ method: 'post', path: `${outline}/refresh`, access: 'outline.create', body: outlineRefreshSchema }, ({ params, body, user }) =>
    refreshOutline(db, engine, params.channelId, params.outlineId, body, user),
  )
  api.add({ method: 'delete', path: outline, access: 'outline.create' }, ({ params }) => removeOutline(db, params.channelId, params.outlineId))
}
