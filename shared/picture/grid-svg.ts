/**
 * The grid as a standalone SVG picture: the drawing the studio's GridBoard makes (same geometry, same palette),
 * centred on a plain background at a given pixel size, with the puzzle's title beside or below it. Text is drawn
 * as outlines the caller supplies, so the picture needs no fonts where it is rasterised and this module stays pure.
 */
import { digitsOf, HOUSES, houseIndex } from '../grid'
import type { BoardPicture } from './board-at'
import { BOX_LINES, CANDIDATE_OFFSET, CELL, CELLS, GRID_PAD, GRID_SIZE, HATCH, houseRect, MARK, THIN_LINES, tubePath } from './geometry'
import { PALETTE } from './palette'

/** Text as outlines: `d` draws it from x = 0, centred on y = 0 like `dominant-baseline: central`; `width` is its advance. */
export type TextShape = (text: string, size: number, weight: 400 | 600) => { d: string; width: number }

export interface GridSvgOptions {
  /** the picture's size in pixels */
  width: number
  height: number
  /** the step's tints, rings, strikes, placement marks and chain; without them only digits, candidates and thermometers */
  highlights: boolean
  /** set beside a wide grid or under a square one; without it the grid stands alone in the middle */
  title?: string
  textShape: TextShape
}

/** An SVG document of the board at `width`×`height` pixels. */
export function gridSvg(board: BoardPicture, options: GridSvgOptions): string {
  const { width, height, title, textShape } = options
  if (!(width > 0 && height > 0)) throw new Error(`gridSvg: the picture needs a positive size, got ${width}×${height}`)
  const layout = layoutOf(width, height, Boolean(title))
  // the grid with room for its frame's stroke, as GridBoard's viewBox has it
  const scale = layout.grid.size / (GRID_SIZE + 2 * GRID_PAD)
  const pad = GRID_PAD
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    title ? `<title>${escapeXml(title)}</title>` : '',
    `<rect width="${width}" height="${height}" fill="${PALETTE.page}"/>`,
    `<g transform="translate(${num(layout.grid.x + pad * scale)} ${num(layout.grid.y + pad * scale)}) scale(${num(scale)})">`,
    drawGrid(board, options.highlights, textShape),
    '</g>',
    title ? drawTitle(title, layout.title, textShape) : '',
    '</svg>',
  ]
  return parts.join('')
}

/** Where the grid's nine columns and rows lie in a picture of this size: its top-left corner and side, in pixels. */
export function gridPlacement(width: number, height: number, titled: boolean): { x: number; y: number; size: number } {
  const { grid } = layoutOf(width, height, titled)
  const pad = (grid.size * GRID_PAD) / (GRID_SIZE + 2 * GRID_PAD)
  return { x: grid.x + pad, y: grid.y + pad, size: grid.size - 2 * pad }
}

interface TitleBox {
  x: number
  /** centre of the block of lines */
  y: number
  width: number
  size: number
  maxLines: number
  anchor: 'start' | 'middle'
}

interface Layout {
  grid: { x: number; y: number; size: number }
  title: TitleBox
}

// Margins and title sizes as fractions of the picture's short side, so any size keeps the same proportions.
const MARGIN = 1 / 15
const TITLE_BESIDE = 0.072
const TITLE_UNDER = 0.05

/** Wider than tall: grid on the left, title beside it; otherwise: grid on top, title under it. */
function layoutOf(width: number, height: number, titled: boolean): Layout {
  const short = Math.min(width, height)
  const margin = short * MARGIN
  if (!titled) {
    const grid = short - 2 * margin
    return { grid: { x: (width - grid) / 2, y: (height - grid) / 2, size: grid }, title: { x: 0, y: 0, width: 0, size: 0, maxLines: 0, anchor: 'start' } }
  }
  if (width > height * 1.2) {
    const grid = height - 2 * margin
    const x = margin + grid + margin
    const size = short * TITLE_BESIDE
    return { grid: { x: margin, y: margin, size: grid }, title: { x, y: height / 2, width: width - x - margin, size, maxLines: 4, anchor: 'start' } }
  }
  const size = short * TITLE_UNDER
  const titleBand = size * 2.2
  const grid = Math.min(width - 2 * margin, height - 2 * margin - titleBand)
  const gridY = margin
  return {
    grid: { x: (width - grid) / 2, y: gridY, size: grid },
    title: { x: width / 2, y: gridY + grid + (height - gridY - grid) / 2, width: width - 2 * margin, size, maxLines: 1, anchor: 'middle' },
  }
}

function drawTitle(title: string, box: TitleBox, text: TextShape): string {
  const lines = wrap(title.trim(), box.width, box.maxLines, (s) => text(s, box.size, 600).width)
  const lineHeight = box.size * 1.22
  const top = box.y - ((lines.length - 1) * lineHeight) / 2
  return lines
    .map((line, i) => {
      const shape = text(line, box.size, 600)
      const x = box.anchor === 'middle' ? box.x - shape.width / 2 : box.x
      return glyphs(shape.d, x, top + i * lineHeight, PALETTE.ink)
    })
    .join('')
}

/** Greedy word wrap into at most `maxLines` lines no wider than `width`; what doesn't fit ends in an ellipsis. */
function wrap(text: string, width: number, maxLines: number, measure: (s: string) => number): string[] {
  const lines: string[] = []
  let line = ''
  const words = text.split(/\s+/).filter(Boolean)
  for (let i = 0; i < words.length; i++) {
    const next = line ? `${line} ${words[i]}` : words[i]
    if (measure(next) <= width || !line) {
      line = next
      continue
    }
    lines.push(line)
    line = words[i]
    if (lines.length === maxLines) {
      line = ''
      lines[maxLines - 1] = ellipsis(`${lines[maxLines - 1]} ${words.slice(i).join(' ')}`, width, measure)
      break
    }
  }
  if (line) lines.push(line)
  return lines.map((l) => (measure(l) > width ? ellipsis(l, width, measure) : l))
}

function ellipsis(text: string, width: number, measure: (s: string) => number): string {
  if (measure(text) <= width) return text
  let cut = text
  while (cut.length > 1 && measure(`${cut}…`) > width) cut = cut.slice(0, -1).trimEnd()
  return `${cut}…`
}

/** The grid in its own units (0…GRID_SIZE), in GridBoard's drawing order. */
function drawGrid(board: BoardPicture, highlights: boolean, text: TextShape): string {
  const focus = new Set(highlights ? board.focus : [])
  const reason = new Set(highlights ? board.reasonCells : [])
  if (highlights) for (const h of board.reasonHouses) for (const c of HOUSES[houseIndex(h)]) reason.add(c)
  const struck = new Map<number, Set<number>>()
  if (highlights) {
    for (const e of board.eliminated) {
      const set = struck.get(e.cell) ?? new Set<number>()
      for (const d of e.digits) set.add(d)
      struck.set(e.cell, set)
    }
  }
  const marks = new Set(board.marks)
  const placed = new Set(highlights ? board.placed : [])
  const out: string[] = []

  // cells: tints
  for (let c = 0; c < 81; c++) {
    const fill = focus.has(c) ? PALETTE.focus : reason.has(c) ? PALETTE.reason : PALETTE.paper
    out.push(`<rect x="${CELLS[c].x}" y="${CELLS[c].y}" width="${CELL}" height="${CELL}" fill="${fill}"/>`)
  }
  // reason cells: hatch as well as tint, so focus and reason differ by more than colour
  const hatch = [...reason].sort((a, b) => a - b).map((c) => HATCH[c]).join('')
  if (hatch) out.push(`<path d="${hatch}" fill="none" stroke="${PALETTE.reasonHatch}" stroke-width="3" stroke-opacity="0.35"/>`)
  if (highlights) {
    for (const h of board.reasonHouses) {
      const r = houseRect(h)
      const inset = MARK.houseInset
      out.push(
        `<rect x="${r.x + inset}" y="${r.y + inset}" width="${r.w - 2 * inset}" height="${r.h - 2 * inset}" rx="6" fill="none" stroke="${PALETTE.reasonLine}" stroke-width="4" stroke-dasharray="14 10"/>`,
      )
    }
  }
  out.push(drawThermometers(board, highlights))
  for (const c of focus) {
    const inset = MARK.focusInset
    const size = CELL - 2 * inset
    out.push(`<rect x="${CELLS[c].x + inset}" y="${CELLS[c].y + inset}" width="${size}" height="${size}" rx="4" fill="none" stroke="${PALETTE.focusRing}" stroke-width="8"/>`)
  }
  out.push(`<path d="${THIN_LINES}" fill="none" stroke="${PALETTE.thinLine}" stroke-width="1.5"/>`)
  out.push(`<path d="${BOX_LINES}" fill="none" stroke="${PALETTE.ink}" stroke-width="5"/>`)
  out.push(`<rect x="0" y="0" width="${GRID_SIZE}" height="${GRID_SIZE}" fill="none" stroke="${PALETTE.ink}" stroke-width="7"/>`)

  for (let c = 0; c < 81; c++) out.push(drawCellMarks(board, c, { marks, struck, placed, tinted: focus.has(c) || reason.has(c) }, text))
  if (highlights) out.push(drawChain(board.chain, text))
  return out.join('')
}

function drawThermometers(board: BoardPicture, highlights: boolean): string {
  const reason = new Set(highlights ? board.reasonThermometers : [])
  return board.thermometers
    .map((cells, index) => {
      if (!cells.length) return ''
      const d = tubePath(cells)
      const bulb = CELLS[cells[0]]
      const halo = reason.has(index)
        ? `<path d="${d}" fill="none" stroke="${PALETTE.reasonLine}" stroke-width="${MARK.tubeHalo}" stroke-linecap="round" stroke-linejoin="round" stroke-dasharray="10 8"/>` +
          `<circle cx="${bulb.cx}" cy="${bulb.cy}" r="${MARK.bulbHalo}" fill="${PALETTE.reasonLine}"/>`
        : ''
      return (
        halo +
        `<path d="${d}" fill="none" stroke="${PALETTE.thermo}" stroke-width="${MARK.tube}" stroke-linecap="round" stroke-linejoin="round"/>` +
        `<circle cx="${bulb.cx}" cy="${bulb.cy}" r="${MARK.bulb}" fill="${PALETTE.thermoBulb}" stroke="${PALETTE.thermo}" stroke-width="3"/>`
      )
    })
    .join('')
}

interface CellMarks {
  marks: Set<number>
  struck: Map<number, Set<number>>
  placed: Set<number>
  tinted: boolean
}

function drawCellMarks(board: BoardPicture, cell: number, { marks, struck, placed, tinted }: CellMarks, text: TextShape): string {
  const geo = CELLS[cell]
  const digit = board.digits[cell] ?? 0
  if (digit) {
    const given = board.givens[cell] === 1
    const shape = text(String(digit), MARK.digitSize, given ? 600 : 400)
    let out = glyphs(shape.d, geo.cx - shape.width / 2, geo.cy + 3, given ? PALETTE.ink : PALETTE.deduced)
    if (placed.has(cell)) {
      const y = geo.cy + MARK.placedBelow
      out += `<line x1="${geo.cx - MARK.placedHalf}" y1="${y}" x2="${geo.cx + MARK.placedHalf}" y2="${y}" stroke="${PALETTE.deduced}" stroke-width="5" stroke-linecap="round"/>`
    }
    return out
  }
  const gone = struck.get(cell) ?? new Set<number>()
  const shown = marks.has(cell) ? digitsOf(board.candidates[cell] ?? 0).filter((d) => !gone.has(d)) : []
  let out = ''
  for (const d of shown) out += candidate(text, d, geo.cx + CANDIDATE_OFFSET[d].dx, geo.cy + CANDIDATE_OFFSET[d].dy + 1, 400, tinted ? PALETTE.candidateOnTint : PALETTE.candidate)
  for (const d of [...gone].sort((a, b) => a - b)) {
    const x = geo.cx + CANDIDATE_OFFSET[d].dx
    const y = geo.cy + CANDIDATE_OFFSET[d].dy
    out += candidate(text, d, x, y + 1, 600, PALETTE.eliminated)
    out += `<line x1="${x - MARK.strikeX}" y1="${y + MARK.strikeY}" x2="${x + MARK.strikeX}" y2="${y - MARK.strikeY}" stroke="${PALETTE.eliminated}" stroke-width="3" stroke-linecap="round"/>`
  }
  return out
}

function candidate(text: TextShape, d: number, x: number, y: number, weight: 400 | 600, fill: string): string {
  const shape = text(String(d), MARK.candidateSize, weight)
  return glyphs(shape.d, x - shape.width / 2, y, fill)
}

function drawChain(chain: readonly number[], text: TextShape): string {
  if (!chain.length) return ''
  const stops = chain.map((c) => ({ x: CELLS[c].x + MARK.chainStop, y: CELLS[c].y + MARK.chainStop }))
  let out = ''
  if (stops.length > 1) {
    const d = stops.map((s, i) => `${i ? 'L' : 'M'}${s.x} ${s.y}`).join('')
    out += `<path d="${d}" fill="none" stroke="${PALETTE.ink}" stroke-opacity="0.55" stroke-width="4" stroke-dasharray="2 9" stroke-linecap="round"/>`
  }
  stops.forEach((s, i) => {
    out += `<circle cx="${s.x}" cy="${s.y}" r="${MARK.chainRadius}" fill="${PALETTE.paper}" stroke="${PALETTE.ink}" stroke-width="2.5"/>`
    const shape = text(String(i + 1), MARK.chainNumberSize, 600)
    out += glyphs(shape.d, s.x - shape.width / 2, s.y + 1, PALETTE.ink)
  })
  return out
}

function glyphs(d: string, x: number, y: number, fill: string): string {
  return d ? `<path transform="translate(${num(x)} ${num(y)})" d="${d}" fill="${fill}"/>` : ''
}

const num = (n: number): string => String(Math.round(n * 100) / 100)

const XML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' }

function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (ch) => XML_ESCAPES[ch] ?? ch)
}
