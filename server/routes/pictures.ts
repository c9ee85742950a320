import { pictureQuerySchema } from '../../shared/schemas/episode'
import type { Db } from '../db/knex'
import type { Exports } from '../workers/export-pool'
import { gridPictureOf } from '../services/pictures'
import { Download, type EndpointTable } from './endpoint'

/** A take's grid as a picture at any step, for thumbnails. */
export function pictureEndpoints(api: EndpointTable, db: Db, exports: Exports): void {
  api.add({ method: 'get', path: '/channels/:channelId/outlines/:outlineId/picture.png', access: 'outline.read', query: pictureQuerySchema }, async ({ params, query }) => {
    const { filename, png } = await gridPictureOf(db, exports, params.channelId, params.outlineId, query)
    return new Download(filename, 'image/png', png)
  })
}
