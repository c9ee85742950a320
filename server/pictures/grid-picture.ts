/** Grid pictures as PNG: the shared SVG drawing, rasterised by resvg on libuv's thread pool (off the request thread). */
import { renderAsync } from '@resvg/resvg-js'
import { boardAt } from '../../shared/picture/board-at'
import { gridSvg } from '../../shared/picture/grid-svg'
import type { Outline } from '../../shared/schemas/outline'
import type { PictureQuery } from '../../shared/schemas/episode'
import { HttpError } from '../errors'
import { textShapes } from './digit-paths'

/** Pixel sizes of the picture shapes: a video thumbnail or preview, and a square for feeds. */
const PICTURE_SIZES: Record<PictureQuery['shape'], { width: number; height: number }> = {
  wide: { width: 1280, height: 720 },
  square: { width: 1080, height: 1080 },
}

export interface GridPictureRequest {
  outline: Pick<Outline, 'puzzle' | 'steps' | 'status' | 'title'>
  /** after which step (0 = the givens) */
  step: number
  shape: PictureQuery['shape']
  highlights: boolean
  /** the title set beside or under the grid: the puzzle's title when absent, none when empty */
  title?: string
}

/** A step past the take's last is the caller's mistake (400); checked before a picture is sent to be drawn elsewhere. */
export function checkPictureStep(count: number, step: number): void {
  if (!Number.isInteger(step) || step < 0 || step > count) {
    throw new HttpError(400, 'step-out-of-range', `This take has ${count} ${count === 1 ? 'step' : 'steps'}; pick a step from 0 to ${count}`)
  }
}

/** The grid after a step as PNG bytes. */
export async function renderGridPicture({ outline, step, shape, highlights, title = outline.title }: GridPictureRequest): Promise<Buffer> {
  checkPictureStep(outline.steps.length, step)
  const svg = gridSvg(boardAt(outline, step), { ...PICTURE_SIZES[shape], highlights, title, textShape: await textShapes() })
  try {
    // the picture's text is outlines already: no font lookup, and no system fonts to scan
    const image = await renderAsync(svg, { fitTo: { mode: 'original' }, font: { loadSystemFonts: false } })
    return image.asPng()
  } catch (error) {
    throw new Error(`the grid picture could not be drawn: ${(error as Error).message}`, { cause: error })
  }
}
