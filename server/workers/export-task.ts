/**
 * Heavy exports for the API, one export per task name. They run in the export pool's threads
 * (export-pool.ts), so a layout that runs long never holds up other requests.
 */
import type { Outline } from '../../shared/schemas/outline'
import { renderCueSheetPdf } from '../exports/cue-sheet-pdf'
import type { GridPictureRequest } from '../pictures/grid-picture'

export interface CueSheetTask {
  /** the stored outline document as JSON text, parsed here rather than on the request thread */
  document: string
  /** draw the grid beside each line */
  thumbnails: boolean
}

/** The cue-sheet PDF of a stored (so already validated) outline document. */
export function cueSheet({ document, thumbnails }: CueSheetTask): Promise<Buffer> {
  return renderCueSheetPdf(JSON.parse(document) as Outline, { thumbnails })
}

/**
 * A grid picture as PNG: its drawing and its encoding (tens of milliseconds of CPU each) stay off the request
 * thread. The picture code (resvg's native module, the fonts) loads on the first picture, not with every
 * export thread, so a thread that only makes cue sheets starts as quickly as before.
 */
export async function gridPicture(request: GridPictureRequest): Promise<Buffer> {
  const { renderGridPicture } = await import('../pictures/grid-picture')
  return renderGridPicture(request)
}
