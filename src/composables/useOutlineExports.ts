import { ref } from 'vue'
import { exportFileName, toDescription, toOutlineJson, toSrt, toWebVttCaptions, toWebVttChapters, type Outline } from '@shared/script'
import { gridPictureFileName } from '@shared/picture/file-name'
import type { PictureQuery } from '@shared/schemas/episode'
import { isApiError } from '@/api/http'
import { getCueSheet, getGridPicture } from '@/api/outlines'
import { saveFile } from '@/composables/fileDownload'

export type ExportKind = 'vtt-chapters' | 'vtt-captions' | 'srt' | 'description' | 'json' | 'cue-sheet' | 'cue-sheet-grids'

/** What the export menu offers, in the order an editor reaches for them. */
export const EXPORT_CHOICES: { kind: ExportKind; label: string }[] = [
  { kind: 'description', label: 'Video description (chapters, credit, link)' },
  { kind: 'vtt-chapters', label: 'Chapters (WebVTT)' },
  { kind: 'vtt-captions', label: 'Captions (WebVTT)' },
  { kind: 'srt', label: 'Captions (SRT)' },
  { kind: 'cue-sheet', label: 'Cue sheet to print (PDF)' },
  { kind: 'cue-sheet-grids', label: 'Cue sheet with grids (PDF)' },
  { kind: 'json', label: 'Whole outline (JSON backup)' },
]

const TEXT_EXPORTS: Record<Exclude<ExportKind, 'cue-sheet' | 'cue-sheet-grids'>, { file: string; type: string; make: (o: Outline) => string }> = {
  description: { file: 'description.txt', type: 'text/plain;charset=utf-8', make: toDescription },
  'vtt-chapters': { file: 'chapters.vtt', type: 'text/vtt;charset=utf-8', make: toWebVttChapters },
  'vtt-captions': { file: 'captions.vtt', type: 'text/vtt;charset=utf-8', make: toWebVttCaptions },
  srt: { file: 'captions.srt', type: 'application/x-subrip;charset=utf-8', make: toSrt },
  json: { file: 'outline.json', type: 'application/json', make: toOutlineJson },
}

interface Options {
  channelId: () => number
  outlineId: () => number
  /** the document as edited now: text exports include edits not yet saved */
  outline: () => Outline | null
  take: () => string
  /** the PDF is made on the server from the saved copy, so pending edits are saved first */
  saveFirst: () => Promise<void>
}

/** Downloads an outline's exports: text formats are made here from the current document, the PDF and grid pictures by the server. */
export function useOutlineExports(options: Options) {
  const busy = ref(false)
  const error = ref<string | null>(null)

  async function run(work: (doc: Outline) => Promise<void>): Promise<void> {
    const doc = options.outline()
    if (!doc || busy.value) return
    error.value = null
    busy.value = true
    try {
      await work(doc)
    } catch (e) {
      error.value = isApiError(e) ? e.message : `The export failed: ${(e as Error).message}`
    } finally {
      busy.value = false
    }
  }

  function exportAs(kind: ExportKind): Promise<void> {
    return run(async (doc) => {
      if (kind === 'cue-sheet' || kind === 'cue-sheet-grids') {
        await options.saveFirst()
        const pdf = await getCueSheet(options.channelId(), options.outlineId(), kind === 'cue-sheet-grids')
        saveFile(exportFileName(doc.title, options.take(), 'cue-sheet.pdf'), pdf)
      } else {
        const made = TEXT_EXPORTS[kind]
        saveFile(exportFileName(doc.title, options.take(), made.file), made.make(doc), made.type)
      }
    })
  }

  /** The grid as a picture; drawn from the puzzle and the path, which edits never change, so nothing is saved first. */
  function downloadPicture(query: PictureQuery): Promise<void> {
    return run(async (doc) => {
      const png = await getGridPicture(options.channelId(), options.outlineId(), query)
      saveFile(gridPictureFileName(doc.title, options.take(), query), png)
    })
  }

  return { busy, error, exportAs, downloadPicture }
}
