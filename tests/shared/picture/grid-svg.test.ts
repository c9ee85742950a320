// The grid picture as SVG. Well-formedness is checked by resvg (npm @resvg/resvg-js), whose XML reader refuses
// malformed documents; the rest reads the drawing's elements.
import { Resvg } from '@resvg/resvg-js'
import { describe, expect, test } from 'vitest'
import { boardAt } from '../../../shared/picture/board-at'
import { gridPlacement, gridSvg, type TextShape } from '../../../shared/picture/grid-svg'
import { PALETTE } from '../../../shared/picture/palette'
import { outlineFor } from '../../helpers/studio-outline'

// Each text drawn as a box as wide as its characters: stands in for font outlines, and counts them.
const drawn: string[] = []
const boxes: TextShape = (text, size) => {
  drawn.push(text)
  const width = text.length * size * 0.5
  return { d: `M0 ${-size / 2}h${width}v${size}h${-width}z`, width }
}
const options = { width: 1280, height: 720, textShape: boxes }

const fills = (svg: string, colour: string) => svg.split(`fill="${colour}"`).length - 1

describe('gridSvg', () => {
  const outline = outlineFor('GT13')
  const k = outline.steps.findIndex((s) => s.eliminations.length > 0 && s.reason.thermometers.length > 0) + 1
  const board = boardAt(outline, k)

  test('gridSvg(board) => an SVG document resvg reads, at the size asked for', () => {
    const svg = gridSvg(board, { ...options, highlights: true, title: 'Thermo & "friends" <3' })
    const image = new Resvg(svg).render()
    expect([image.width, image.height]).toEqual([1280, 720])
    expect(svg).toContain('<title>Thermo &amp; &quot;friends&quot; &lt;3</title>')
  })

  test('gridSvg(board) => one outline per digit and per candidate shown, in the palette of the app', () => {
    drawn.length = 0
    const svg = gridSvg(board, { ...options, highlights: false })
    const digits = Array.from(board.digits).filter(Boolean).length
    const candidates = board.marks.reduce((n, c) => n + (board.digits[c] ? 0 : board.candidates[c]!.toString(2).split('1').length - 1), 0)
    expect(drawn.length).toBe(digits + candidates)
    const givens = Array.from(board.givens).filter(Boolean).length
    expect(fills(svg, PALETTE.ink)).toBe(givens)
    expect(fills(svg, PALETTE.deduced)).toBe(digits - givens)
    // one tube and one bulb per thermometer
    expect(svg.split(`stroke="${PALETTE.thermo}"`).length - 1).toBe(2 * outline.puzzle.thermometers.length)
  })

  test('gridSvg(board, highlights off) => no focus or reason tint, no hatch, no house outline, no rings, no strikes', () => {
    // a step with focus cells, reason cells and houses, and removals
    const at = outline.steps.findIndex((s) => s.reason.cells.length > 0 && s.reason.houses.length > 0 && s.eliminations.length > 0) + 1
    const marked = boardAt(outline, at)
    const on = gridSvg(marked, { ...options, highlights: true })
    const off = gridSvg(marked, { ...options, highlights: false })
    expect(fills(on, PALETTE.focus)).toBe(marked.focus.length)
    expect(fills(on, PALETTE.reason)).toBeGreaterThan(0)
    for (const colour of [PALETTE.focusRing, PALETTE.reasonHatch, PALETTE.reasonLine, PALETTE.eliminated]) expect(on).toContain(`stroke="${colour}"`)
    for (const colour of [PALETTE.focus, PALETTE.reason]) expect(fills(off, colour)).toBe(0)
    for (const colour of [PALETTE.focusRing, PALETTE.reasonHatch, PALETTE.reasonLine, PALETTE.eliminated]) expect(off).not.toContain(colour)
  })

  test('gridSvg(board, title) => the title set beside the grid, within the picture, a long one cut with an ellipsis', () => {
    drawn.length = 0
    const long = 'A title of many words that goes on and on well past what four lines beside a grid can hold at this size'
    const svg = gridSvg(board, { ...options, highlights: false, title: long })
    const grid = gridPlacement(1280, 720, true)
    // the title's outlines follow the grid's group; each is a box from its translate() as wide as its text
    const lines = [...svg.slice(svg.lastIndexOf('</g>')).matchAll(/translate\(([\d.]+) ([\d.]+)\)" d="M0 -[\d.]+h([\d.]+)/g)].map(([, x, y, w]) => ({ x: +x!, y: +y!, w: +w! }))
    expect(lines).toHaveLength(4)
    for (const line of lines) {
      expect(line.x).toBeGreaterThan(grid.x + grid.size)
      expect(line.x + line.w).toBeLessThanOrEqual(1280 - grid.x)
    }
    expect(drawn.filter((t) => t.endsWith('…')).length).toBeGreaterThan(0)
    expect(svg).toContain(`<title>${long}</title>`)
  })

  test('gridSvg(board) without a title => the grid alone in the middle', () => {
    const grid = gridPlacement(1280, 720, false)
    expect(grid.x + grid.size / 2).toBeCloseTo(640)
    expect(grid.y + grid.size / 2).toBeCloseTo(360)
    expect(gridSvg(board, { ...options, highlights: false })).not.toContain('<title>')
  })

  test('gridSvg(board, no size) => throws', () => {
    expect(() => gridSvg(board, { ...options, width: 0, highlights: true })).toThrow('gridSvg: the picture needs a positive size, got 0×720')
  })
})
