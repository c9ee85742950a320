import type { PictureQuery } from '../schemas/episode'
import { exportFileName } from '../script/file-names'

/** A grid picture's file name: the outline's export name, then which step, which shape, and whether it is plain. */
export function gridPictureFileName(title: string, take: string, { step, shape, highlights }: PictureQuery): string {
  return exportFileName(title, take, `grid-step-${step}-${shape}${highlights === 'off' ? '-plain' : ''}.png`)
}
