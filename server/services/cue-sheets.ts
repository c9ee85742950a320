import { exportFileName } from '../../shared/script/index'
import { renderCueSheetPdf } from '../exports/cue-sheet-pdf'
import type { Db } from '../db/knex'
import { outlineOf } from './outlines'

export interface CueSheetFile {
  filename: string
  pdf: Buffer
}

/** The printable cue sheet of an outline, named after its puzzle and take. */
export async function cueSheetOf(db: Db, channelId: number, outlineId: number, thumbnails: boolean): Promise<CueSheetFile> {
  const record = await outlineOf(db, channelId, outlineId)
  const pdf = await renderCueSheetPdf(record.outline, { thumbnails })
  return { filename: exportFileName(record.outline.title, record.name, 'cue-sheet.pdf'), pdf }
}
