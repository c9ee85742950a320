/**
 * The cue sheet PDF, checked against the PDF format itself (ISO 32000-1: a file starts with
 * "%PDF-", ends with "%%EOF", and the page tree's /Count is its number of pages). Only the
 * document structure is read, so compressed content streams don't matter.
 */
import { describe, expect, test } from 'vitest'
import { ROWS_PER_PAGE, renderCueSheetPdf } from '../../../server/exports/cue-sheet-pdf'
import { buildOutline, cueSheetRows } from '../../../shared/script/index'
import { hiddenSingle, nakedSingle, puzzle, result } from '../../shared/script/steps'

const steps = Array.from({ length: 81 }, (_, c) => (c % 2 ? nakedSingle(c) : hiddenSingle(c)))
const outline = buildOutline(puzzle({ thermometers: [] }), result(steps))

const pageCount = (pdf: Buffer) => {
  const counts = [...pdf.toString('latin1').matchAll(/\/Type \/Pages[\s\S]*?\/Count (\d+)/g)].map((m) => Number(m[1]))
  return Math.max(...counts)
}

describe('renderCueSheetPdf', () => {
  test('a PDF with about 20 lines a page', async () => {
    const pdf = await renderCueSheetPdf(outline)
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(pdf.subarray(-6).toString('latin1')).toMatch(/%%EOF/)
    const rows = cueSheetRows(outline).length
    const pages = pageCount(pdf)
    expect(pages).toBeGreaterThanOrEqual(Math.ceil(rows / ROWS_PER_PAGE))
    expect(pages).toBeLessThanOrEqual(Math.ceil(rows / ROWS_PER_PAGE) + 2)
  })

  test('with grid thumbnails', async () => {
    const pdf = await renderCueSheetPdf(outline, { thumbnails: true })
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(pageCount(pdf)).toBeGreaterThanOrEqual(Math.ceil(cueSheetRows(outline).length / ROWS_PER_PAGE))
  })
})
