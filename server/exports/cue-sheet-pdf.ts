/**
 * The printable cue sheet as a PDF: number, step, time, an optional grid thumbnail and the line
 * to say, at most 20 lines a page so the presenter can find their place at a glance.
 */
import { existsSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import PDFDocument from 'pdfkit'
import { cueSheetRows, formatClock, timeline, type CueSheetRow, type Outline } from '../../shared/script/index'

export const ROWS_PER_PAGE = 20

export interface CueSheetOptions {
  /** draw the grid as it stands before each line (default false: text only) */
  thumbnails?: boolean
}

// Gridcue's palette (product.md): ink for text, amber for the step's focus cells, slate for rules.
const INK = '#1F2430'
const SLATE = '#64748B'
const AMBER = '#FDE68A'
const TEAL = '#0F766E'
const MARGIN = 40
const THUMB = 54

/** Renders the cue sheet and resolves with the PDF bytes. */
export function renderCueSheetPdf(outline: Outline, options: CueSheetOptions = {}): Promise<Buffer> {
  const rows = cueSheetRows(outline)
  const doc = new PDFDocument({ size: 'A4', margin: MARGIN, info: { Title: `Cue sheet: ${outline.title}`, Author: outline.author ?? '' } })
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  const fonts = registerFonts(doc)
  const total = formatClock(timeline(outline).totalMs)
  const col = { num: MARGIN, step: MARGIN + 24, time: MARGIN + 70, thumb: MARGIN + 108 }
  const textX = options.thumbnails ? col.thumb + THUMB + 10 : col.thumb
  const textW = doc.page.width - MARGIN - textX
  const bottom = () => doc.page.height - MARGIN

  const header = (page: number) => {
    doc.font(fonts.bold).fontSize(13).fillColor(INK).text(outline.title, MARGIN, MARGIN, { width: doc.page.width - 2 * MARGIN })
    doc
      .font(fonts.regular)
      .fontSize(8.5)
      .fillColor(SLATE)
      .text(`${outline.author ? `by ${outline.author} · ` : ''}${outline.pace} words a minute · ${total} in all · page ${page}`)
    doc.moveDown(0.6)
  }

  let page = 1
  let onPage = 0
  header(page)
  for (const row of rows) {
    doc.font(fonts.regular).fontSize(9.5)
    const textH = doc.heightOfString(row.text, { width: textW })
    const chapterH = row.chapter ? 16 : 0
    const rowH = Math.max(textH, options.thumbnails ? THUMB : 0) + chapterH + 8
    if (onPage >= ROWS_PER_PAGE || (onPage > 0 && doc.y + rowH > bottom())) {
      doc.addPage()
      header(++page)
      onPage = 0
    }
    let y = doc.y
    if (row.chapter) {
      doc.font(fonts.bold).fontSize(10).fillColor(TEAL).text(row.chapter, MARGIN, y)
      y += chapterH
    }
    doc.font(fonts.mono).fontSize(8.5).fillColor(SLATE)
    doc.text(String(row.number), col.num, y + 1, { width: 22 })
    doc.text(row.steps || '–', col.step, y + 1, { width: 44 })
    doc.text(row.time, col.time, y + 1, { width: 36 })
    if (options.thumbnails) drawThumbnail(doc, row, col.thumb, y, fonts.mono)
    doc.font(fonts.regular).fontSize(9.5).fillColor(INK).text(row.text, textX, y, { width: textW })
    doc.y = y + rowH - chapterH
    doc.moveTo(MARGIN, doc.y - 4).lineTo(doc.page.width - MARGIN, doc.y - 4).lineWidth(0.3).strokeColor('#CBD5E1').stroke()
    onPage++
  }
  doc.end()
  return done
}

function drawThumbnail(doc: PDFKit.PDFDocument, row: CueSheetRow, x: number, y: number, mono: string): void {
  const cell = THUMB / 9
  for (const c of row.focus) doc.rect(x + (c % 9) * cell, y + Math.floor(c / 9) * cell, cell, cell).fill(AMBER)
  doc.font(mono).fontSize(4.2).fillColor(INK)
  for (let c = 0; c < 81; c++) {
    const ch = row.grid[c]
    if (ch !== '.') doc.text(ch, x + (c % 9) * cell, y + Math.floor(c / 9) * cell + 1, { width: cell, align: 'center', lineBreak: false })
  }
  for (let i = 0; i <= 9; i++) {
    doc.lineWidth(i % 3 === 0 ? 0.6 : 0.2).strokeColor(i % 3 === 0 ? INK : SLATE)
    doc.moveTo(x + i * cell, y).lineTo(x + i * cell, y + THUMB).stroke()
    doc.moveTo(x, y + i * cell).lineTo(x + THUMB, y + i * cell).stroke()
  }
}

/** IBM Plex when the fontsource packages are installed (our type, product.md); PDF base fonts otherwise. */
function registerFonts(doc: PDFKit.PDFDocument): { regular: string; bold: string; mono: string } {
  try {
    const require = createRequire(import.meta.url)
    const sans = join(dirname(require.resolve('@fontsource/ibm-plex-sans/package.json')), 'files')
    const mono = join(dirname(require.resolve('@fontsource/ibm-plex-mono/package.json')), 'files')
    const files = {
      regular: join(sans, 'ibm-plex-sans-latin-400-normal.woff'),
      bold: join(sans, 'ibm-plex-sans-latin-600-normal.woff'),
      mono: join(mono, 'ibm-plex-mono-latin-400-normal.woff'),
    }
    if (Object.values(files).every(existsSync)) {
      doc.registerFont('plex', files.regular)
      doc.registerFont('plex-bold', files.bold)
      doc.registerFont('plex-mono', files.mono)
      return { regular: 'plex', bold: 'plex-bold', mono: 'plex-mono' }
    }
  } catch {
    // fall through to the base fonts every PDF reader has
  }
  return { regular: 'Helvetica', bold: 'Helvetica-Bold', mono: 'Courier' }
}
