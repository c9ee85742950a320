import { exportFileName } from '../../shared/script/index'
import type { Db } from '../db/knex'
import { findOutlineForExport } from '../db/outlines'
import { notFound } from '../errors'
import type { Exports } from '../workers/export-pool'

export interface CueSheetFile {
  filename: string
  pdf: Buffer
}

/** The printable cue sheet of an outline, named after its puzzle and take; drawn in the export pool. */
export async function cueSheetOf(db: Db, exports: Exports, channelId: number, outlineId: number, thumbnails: boolean): Promise<CueSheetFile> {
  const row = await findOutlineForExport(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  const pdf = await exports.cueSheet({ document: row.document, thumbnails })
  return { filename: exportFileName(row.title, row.name, 'cue-sheet.pdf'), pdf }
}
