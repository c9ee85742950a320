/**
 * Every export parsed by a general-purpose parser from npm, not by our own code:
 * - WebVTT: webvtt-parser 2.2.0 (the W3C's webvtt.js, a validator for the W3C WebVTT format)
 * - SRT: subtitle 4.2.2 (parseSync)
 */
import pkg from 'webvtt-parser'
// The full entity table makes the parser decode &amp; etc. as the spec says (its README); without it it keeps the ';'.
import entities from 'webvtt-parser/html-entities.json'
import { parseSync } from 'subtitle'
import { describe, expect, test } from 'vitest'
import {
  alignLine,
  applyEdit,
  buildOutline,
  cueSheetRows,
  fromOutlineJson,
  hideLine,
  publishedChapters,
  timeline,
  toDescription,
  toOutlineJson,
  toSrt,
  toWebVttCaptions,
  toWebVttChapters,
  type Outline,
} from '../../../shared/script/index'
import { THERMO_A, contradiction, hiddenSingle, nakedSingle, puzzle, rc, result, thermoLength } from './steps'

const { WebVTTParser } = pkg
const ALL = Array.from({ length: 81 }, (_, c) => c)
const steps = [thermoLength(0, THERMO_A), contradiction(rc(5, 5), 3, rc(9, 1)), ...ALL.filter((c) => c !== rc(5, 5)).map((c) => (c % 3 ? nakedSingle(c) : hiddenSingle(c)))]
const outline: Outline = buildOutline(puzzle({ title: 'Rising & falling <test>' }), result(steps), { link: 'https://example.com/p/7' })

interface ParsedCue {
  startTime: number
  endTime: number
  text: string
  id: string
  tree: { children: { type: string; value?: string }[] }
}
const vtt = (text: string, mode?: string) => new WebVTTParser(entities).parse(text, mode) as { cues: ParsedCue[]; errors: { message: string }[] }
/** The cue's text as the parser decodes it (entities resolved), from its cue-text tree. */
const decoded = (c: ParsedCue) => c.tree.children.map((n) => n.value ?? '').join('')
const flat = (s: string) => s.replace(/\s+/g, ' ').trim()

describe('exports, checked by third-party parsers', () => {
  test('toWebVttCaptions => valid W3C WebVTT whose cues carry the script in order, at the timeline\'s times', () => {
    const parsed = vtt(toWebVttCaptions(outline))
    expect(parsed.errors).toEqual([])
    const t = timeline(outline)
    const visible = outline.lines.filter((l) => !l.hidden)
    // The cues, joined, say every line's words in order.
    expect(flat(parsed.cues.map(decoded).join(' '))).toBe(flat(visible.map((l) => l.text).join(' ')))
    expect(parsed.cues[0].startTime).toBe(0)
    expect(parsed.cues[parsed.cues.length - 1].endTime).toBeCloseTo(t.totalMs / 1000, 3)
    // Each line's first cue starts at that line's start time.
    let k = 0
    for (const line of t.lines) {
      expect(parsed.cues[k].startTime).toBeCloseTo(line.startMs / 1000, 3)
      while (k < parsed.cues.length && parsed.cues[k].endTime <= line.endMs / 1000 + 1e-6) k++
    }
    for (const c of parsed.cues) {
      expect(c.endTime).toBeGreaterThan(c.startTime)
      for (const row of c.text.split('\n')) expect(row.length).toBeLessThanOrEqual(60)
      expect(c.text.split('\n').length).toBeLessThanOrEqual(2)
    }
  })

  test('toWebVttChapters => a kind=chapters track: one cue per chapter, titles as text, first at 0', () => {
    const parsed = vtt(toWebVttChapters(outline), 'chapters')
    expect(parsed.errors).toEqual([])
    const t = timeline(outline)
    expect(parsed.cues.map((c) => c.text)).toEqual(outline.chapters.map((c) => c.title))
    expect(parsed.cues.map((c) => c.startTime)).toEqual(t.chapters.map((c, i) => (i === 0 ? 0 : c.startMs / 1000)))
    expect(parsed.cues[parsed.cues.length - 1].endTime).toBeCloseTo(t.totalMs / 1000, 3)
    parsed.cues.slice(1).forEach((c, i) => expect(c.startTime).toBe(parsed.cues[i].endTime))
  })

  test('cue text is escaped so markup characters survive (W3C WebVTT: & and < are escaped in cue text)', () => {
    const parsed = vtt(toWebVttCaptions(outline))
    expect(flat(parsed.cues.map((c) => c.text).join(' '))).toContain('Rising &amp; falling &lt;test&gt;')
    expect(flat(parsed.cues.map(decoded).join(' '))).toContain('Rising & falling <test>')
  })

  test('toSrt => SRT that subtitle parses, with the same cues as the WebVTT captions', () => {
    const nodes = parseSync(toSrt(outline)).filter((n) => n.type === 'cue')
    const captions = vtt(toWebVttCaptions(outline)).cues
    expect(nodes.length).toBe(captions.length)
    nodes.forEach((n, i) => {
      if (n.type !== 'cue') return
      expect(n.data.start).toBe(Math.round(captions[i].startTime * 1000))
      expect(n.data.end).toBe(Math.round(captions[i].endTime * 1000))
      // SRT has no escapes: the title's tag-like "<test>" goes out with look-alike brackets (see the next test)
      expect(n.data.text).toBe(decoded(captions[i]).replace('<test>', '‹test›'))
    })
  })

  test('toSrt => text a player would read as formatting (HTML-like tags, braced override codes; common practice) is shown as written', () => {
    const tagged = applyEdit(outline, { op: 'editLineText', lineId: outline.lines[1]!.id, text: 'Put <i>this</i> here, {\\an8}on top, and <font color="red">red</font>; 3 < 5 and 7 > 2 stay.' })
    const cues = parseSync(toSrt(tagged)).flatMap((n) => (n.type === 'cue' ? [n.data.text] : []))
    const said = flat(cues.join(' '))
    expect(said).toContain('Put ‹i›this‹/i› here, {an8}on top, and ‹font color="red"›red‹/font›; 3 < 5 and 7 > 2 stay.')
    expect(said).not.toMatch(/<\/?[a-z]|\{\\/i)
  })

  test('toDescription => setter credit, link, then "m:ss Title" lines, the first at 0:00 (common practice)', () => {
    const text = toDescription(outline)
    const lines = text.trimEnd().split('\n')
    expect(lines[0]).toContain('Pat Setter')
    expect(lines[1]).toContain('https://example.com/p/7')
    const chapterLines = lines.filter((l) => /^\d+:\d\d /.test(l))
    expect(chapterLines[0]).toBe('0:00 The rules')
    expect(chapterLines.map((l) => l.replace(/^\S+ /, ''))).toEqual(publishedChapters(outline).map((c) => c.title))
    const secs = chapterLines.map((l) => l.split(' ')[0].split(':').reduce((a, b) => a * 60 + Number(b), 0))
    secs.slice(1).forEach((s, i) => expect(s).toBeGreaterThan(secs[i]))
  })

  test('toOutlineJson / fromOutlineJson round trip; bad JSON gets a clear error', () => {
    const json = toOutlineJson(outline)
    expect(fromOutlineJson(json)).toEqual(JSON.parse(json))
    expect(() => fromOutlineJson('{')).toThrow(/^outline JSON can't be read/)
    const broken = JSON.parse(json)
    broken.chapters[1].lineId = 999
    expect(() => fromOutlineJson(broken)).toThrow('chapter "' + outline.chapters[1].title + '" starts at line 999, which does not exist')
    const lost = JSON.parse(json)
    lost.lines.splice(3, 1)
    expect(() => fromOutlineJson(lost)).toThrow(/outline JSON is invalid: .*expected step/)
  })

  test('exports use aligned times once the recording is aligned; hidden lines are left out', () => {
    let aligned = outline
    aligned.lines.forEach((l, i) => {
      aligned = alignLine(aligned, l.id, 5_000 + i * 20_000)
    })
    aligned = hideLine(aligned, aligned.lines[2].id)
    const cues = vtt(toWebVttCaptions(aligned)).cues
    expect(cues[0].startTime).toBe(5)
    expect(cues.some((c) => Math.abs(c.startTime - 25) < 1e-9)).toBe(true)
    expect(cues.some((c) => Math.abs(c.startTime - 45) < 1e-9)).toBe(false) // line 3 is hidden
    expect(timeline(aligned).source).toBe('aligned')
    const srt = parseSync(toSrt(aligned)).filter((n) => n.type === 'cue')
    expect(srt[0].type === 'cue' && srt[0].data.start).toBe(5000)
  })

  test('exports count from the trim: a cue at 25 s in the recording is at 20 s in a video cut in at 5 s', () => {
    let aligned = outline
    aligned.lines.forEach((l, i) => {
      aligned = alignLine(aligned, l.id, 5_000 + i * 20_000)
    })
    const trimmed = applyEdit(aligned, { op: 'setTrim', inMs: 5_000, outMs: null })
    const cues = vtt(toWebVttCaptions(trimmed)).cues
    expect(cues[0].startTime).toBe(0)
    expect(cues.some((c) => Math.abs(c.startTime - 20) < 1e-9)).toBe(true)
    const srtStarts = parseSync(toSrt(trimmed)).flatMap((n) => (n.type === 'cue' ? [n.data.start] : []))
    expect(srtStarts[0]).toBe(0)
    expect(srtStarts).toContain(20_000)
    expect(srtStarts).not.toContain(25_000)
  })

  test('cueSheetRows => one row per shown line with step numbers, time and text', () => {
    const rows = cueSheetRows(outline)
    expect(rows).toHaveLength(outline.lines.length)
    expect(rows[0]).toMatchObject({ number: 1, steps: '', time: '0:00', chapter: 'The rules' })
    expect(rows[1].steps).toBe('1')
    const folded = rows.find((r) => r.steps.includes('–'))!
    expect(folded.steps).toMatch(/^\d+–\d+$/)
    expect(rows[1].grid).toHaveLength(81)
  })
})
