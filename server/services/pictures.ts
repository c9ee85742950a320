import { gridPictureFileName } from '../../shared/picture/file-name'
import type { PictureQuery } from '../../shared/schemas/episode'
import type { Db } from '../db/knex'
import { findOutline, outlineOf } from '../db/outlines'
import { notFound } from '../errors'
import { checkPictureStep } from '../pictures/grid-picture'
import type { Exports } from '../workers/export-pool'

export interface GridPictureFile {
  filename: string
  png: Buffer
}

/** A take's grid after one step as a PNG, named after its puzzle, take, step and shape. */
export async function gridPictureOf(db: Db, exports: Exports, channelId: number, outlineId: number, query: PictureQuery): Promise<GridPictureFile> {
  const row = await findOutline(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  const outline = outlineOf(row)
  checkPictureStep(outline.steps.length, query.step)
  const png = await exports.gridPicture({ outline, step: query.step, shape: query.shape, highlights: query.highlights === 'on' })
  return { filename: gridPictureFileName(outline.title, row.name, query), png }
}
