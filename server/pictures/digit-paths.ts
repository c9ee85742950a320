/**
 * Text as outlines in our shipped type (IBM Plex Sans from @fontsource), for grid pictures: resvg reads no WOFF
 * fonts, so digits and titles go into the SVG as paths. The fonts are parsed once, on the first picture.
 */
import { readFile } from 'node:fs/promises'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import opentype from 'opentype.js'
import type { TextShape } from '../../shared/picture/grid-svg'

type Weight = 400 | 600

/** Each weight's fonts, tried in order for every character: the Latin set first, then the extended Latin one. */
type Fonts = Record<Weight, opentype.Font[]>

let loading: Promise<Fonts> | undefined

async function loadFonts(): Promise<Fonts> {
  const files = join(dirname(createRequire(import.meta.url).resolve('@fontsource/ibm-plex-sans/package.json')), 'files')
  const load = async (subset: string, weight: Weight) => {
    const bytes = await readFile(join(files, `ibm-plex-sans-${subset}-${weight}-normal.woff`))
    return opentype.parse(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength))
  }
  const [regular, regularExt, bold, boldExt] = await Promise.all([load('latin', 400), load('latin-ext', 400), load('latin', 600), load('latin-ext', 600)])
  return { 400: [regular, regularExt], 600: [bold, boldExt] }
}

// Digits and chain numbers repeat on every picture; a title is drawn once per picture, so only short texts are kept.
const SHORT = 2
const cache = new Map<string, ReturnType<TextShape>>()

/** The text-shaping function grid pictures draw with, once the fonts are loaded (the first call loads them). */
export async function textShapes(): Promise<TextShape> {
  loading ??= loadFonts().catch((error: unknown) => {
    loading = undefined
    throw new Error(`the fonts for grid pictures could not be read (@fontsource/ibm-plex-sans): ${(error as Error).message}`, { cause: error })
  })
  const fonts = await loading
  return (text, size, weight) => {
    if (text.length > SHORT) return shape(fonts[weight], text, size)
    const key = `${weight}|${size}|${text}`
    let hit = cache.get(key)
    if (!hit) cache.set(key, (hit = shape(fonts[weight], text, size)))
    return hit
  }
}

/**
 * Outlines of `text` from x = 0 with y = 0 on the middle of the em box (SVG's `dominant-baseline: central`). The
 * width comes first and the outlines only when read: wrapping a title measures many candidate lines it never draws.
 */
function shape(fonts: opentype.Font[], text: string, size: number): ReturnType<TextShape> {
  const [main] = fonts
  const baseline = ((main.ascender + main.descender) / 2 / main.unitsPerEm) * size
  const runs = runsByFont(fonts, text).map((run) => ({ ...run, width: run.font.getAdvanceWidth(run.text, size) }))
  let d: string | undefined
  return {
    width: runs.reduce((sum, run) => sum + run.width, 0),
    get d() {
      if (d === undefined) {
        d = ''
        let x = 0
        for (const run of runs) {
          d += run.font.getPath(run.text, x, baseline, size).toPathData(2)
          x += run.width
        }
      }
      return d
    },
  }
}

/** Splits text into runs each drawn by the first font that has their characters (the main font when none has). */
function runsByFont(fonts: opentype.Font[], text: string): { font: opentype.Font; text: string }[] {
  const runs: { font: opentype.Font; text: string }[] = []
  for (const ch of text) {
    const font = fonts.find((f) => f.charToGlyphIndex(ch) > 0) ?? fonts[0]
    const last = runs.at(-1)
    if (last?.font === font) last.text += ch
    else runs.push({ font, text: ch })
  }
  return runs
}
