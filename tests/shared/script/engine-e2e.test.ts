/**
 * The real engine feeding the script writer, and the command line others script against.
 * Puzzles: tests/fixtures/thermo-puzzles.json (GT03, GT04) and classic-puzzles.json.
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import pkg from 'webvtt-parser'
import entities from 'webvtt-parser/html-entities.json'
import { parseSync } from 'subtitle'
import { describe, expect, test } from 'vitest'
import thermo from '../../fixtures/thermo-puzzles.json'
import classic from '../../fixtures/classic-puzzles.json'
import { parsePuzzle, solvePath } from '../../../shared/engine/index'
import { buildOutline, fromOutlineJson, timeline, toDescription, toOutlineJson, toSrt, toWebVttCaptions, toWebVttChapters } from '../../../shared/script/index'

const { WebVTTParser } = pkg
const first = (classic as { puzzles: { givens: string }[] }).puzzles[0]
const files = [
  ...thermo.puzzles.slice(0, 2).map((p) => ({ title: p.title, author: 'Gridcue generator', givens: p.givens, thermometers: p.thermometers })),
  { title: 'Classic grid', givens: first.givens, thermometers: [] as string[][] },
]

describe('engine → script, end to end', () => {
  for (const file of files) {
    test(`${file.title}: one call gives lines, timings, chapters and every export`, () => {
      const { puzzle } = parsePuzzle(file)
      const solved = solvePath(file)
      expect(puzzle).not.toBeNull()
      const outline = buildOutline(puzzle!, solved, { link: 'https://example.com/p' })
      expect(outline.lines.flatMap((l) => l.steps)).toEqual(solved.steps.map((_, i) => i))
      expect(buildOutline(puzzle!, solved, { link: 'https://example.com/p' })).toEqual(outline)
      const t = timeline(outline)
      expect(t.totalMs).toBeGreaterThan(60_000)
      expect(outline.chapters[0].title).toBe('The rules')
      for (const text of [toWebVttCaptions(outline), toWebVttChapters(outline)]) expect(new WebVTTParser(entities).parse(text).errors).toEqual([])
      expect(parseSync(toSrt(outline)).filter((n) => n.type === 'cue').length).toBeGreaterThan(outline.lines.length)
      expect(toDescription(outline)).toMatch(/\n0:00 The rules\n/)
      expect(fromOutlineJson(toOutlineJson(outline))).toEqual(JSON.parse(toOutlineJson(outline)))
      for (const line of outline.lines) expect(line.text).not.toMatch(/undefined|NaN|\[object/)
    })
  }
})

describe('npm run outline', () => {
  const dir = mkdtempSync(join(tmpdir(), 'gridcue-outline-'))
  const run = (args: string[], input?: string) =>
    spawnSync(process.execPath, ['--import', 'tsx', 'scripts/outline.ts', ...args], { input, encoding: 'utf8', timeout: 60_000 })

  test('prints the outline JSON by default, and one export with --format', () => {
    const path = join(dir, 'gt03.json')
    writeFileSync(path, JSON.stringify(files[0]))
    const json = run([path, '--pace', '170', '--names', 'coords'])
    expect(json.status).toBe(0)
    const outline = fromOutlineJson(json.stdout)
    expect(outline).toMatchObject({ pace: 170, names: 'coords' })
    const chapters = run(['-', '--format', 'vtt-chapters'], JSON.stringify(files[0]))
    expect(chapters.status).toBe(0)
    expect(chapters.stdout.startsWith('WEBVTT')).toBe(true)
  }, 60_000)

  test('an invalid puzzle => message on stderr, exit 2; a bad pace => exit 2', () => {
    const bad = run(['-'], JSON.stringify({ title: 'x', givens: '11' + '.'.repeat(79), thermometers: [] }))
    expect(bad.status).toBe(2)
    expect(bad.stdout).toBe('')
    expect(bad.stderr).toMatch(/^outline: invalid puzzle/)
    const pace = run(['-', '--pace', '0'], JSON.stringify(files[0]))
    expect(pace.status).toBe(2)
    expect(pace.stderr).toContain('pace must be between 60 and 400 words a minute (got 0)')
  }, 60_000)
})
