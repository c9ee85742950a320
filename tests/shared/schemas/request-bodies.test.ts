// Every schema a request body (or a studio edit) is checked with: no text or list without a bound, no
// text field that lets a NUL or a lone surrogate through (PostgreSQL refuses the one, UTF-8 can't carry
// the other), and no refinement that throws on a body its own checks have already refused. The bodies
// are real: a puzzle from tests/fixtures and its outline from the engine and script writer.
import fc from 'fast-check'
import { describe, expect, test } from 'vitest'
import { z, type ZodType } from 'zod'
import { signInSchema } from '../../../shared/schemas/auth'
import { LINE_TEXT_MAX, outlineEditSchema, outlineSchema, scriptOf, scriptProblems, type Outline } from '../../../shared/schemas/outline'
import { puzzleFileShape } from '../../../shared/schemas/puzzle'
import { outlineCreateSchema, outlineSaveSchema, puzzleDraftSchema, puzzleUpdateSchema } from '../../../shared/schemas/studio'
import { draftOf } from '../../helpers/studio'
import { outlineFor } from '../../helpers/studio-outline'

const outline = (): Outline => ({ ...outlineFor('GT07', { stopAfter: 6 }), author: 'Pat Setter', link: 'https://example.com/p/7' })
const draft = draftOf('GT13', { author: 'Pat Setter', link: 'https://example.com/p/13', publishedOn: '2026-02-01', notes: 'Bulbs first.' })

/** Each request schema with a valid body. */
const BODIES: { name: string; schema: ZodType; body: () => unknown }[] = [
  { name: 'sign-in', schema: signInSchema, body: () => ({ email: 'ada@example.com', password: 'correct horse' }) },
  { name: 'puzzle draft', schema: puzzleDraftSchema, body: () => draft },
  { name: 'puzzle update', schema: puzzleUpdateSchema, body: () => ({ ...draft, version: 3 }) },
  { name: 'puzzle file', schema: puzzleFileShape, body: () => draftOf('GT13', { author: 'Pat Setter' }) },
  { name: 'new take', schema: outlineCreateSchema, body: () => ({ name: 'Take 2', pace: 170, names: 'coords' }) },
  { name: 'outline save', schema: outlineSaveSchema, body: () => ({ version: 2, name: 'Take 1', script: scriptOf(outline()) }) },
  // no request sends a whole outline any more, but a new take answers one and the studio keeps it in the browser
  { name: 'outline document', schema: outlineSchema, body: outline },
  { name: 'line edit', schema: outlineEditSchema, body: () => ({ op: 'editLineText', lineId: 3, text: 'Look at box five.' }) },
  { name: 'chapter edit', schema: outlineEditSchema, body: () => ({ op: 'renameChapter', lineId: 1, title: 'Opening' }) },
]

describe('request schemas', () => {
  test.each(BODIES)('$name: the valid body parses', ({ schema, body }) => {
    expect(schema.safeParse(body()).error?.issues).toBeUndefined()
  })

  test.each(BODIES)('$name: every text has a length limit or a fixed form, every list a longest length', ({ schema }) => {
    expect(unbounded(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }))).toEqual([])
  })

  test.each(BODIES)('$name: a NUL, a lone surrogate or a megabyte in any text is refused at that field', ({ schema, body }) => {
    for (const { path, value } of textLeaves(body())) {
      for (const hostile of [`${value}\u0000`, `\ud83c${value}`, `${value}\udf21`, 'x'.repeat(2 ** 20)]) {
        const result = schema.safeParse(replaceAt(body(), path, hostile))
        expect(result.success, `${path.join('.')} = ${JSON.stringify(hostile.slice(0, 40))}`).toBe(false)
        expect(result.error!.issues.some((i) => i.path.join('.').startsWith(path.join('.'))), path.join('.')).toBe(true)
      }
    }
  })

  test.each([
    { body: 'sign-in', path: 'password', label: 'password' },
    { body: 'puzzle draft', path: 'title', label: 'title' },
    { body: 'puzzle draft', path: 'author', label: 'author' },
    { body: 'puzzle draft', path: 'notes', label: 'notes' },
    { body: 'puzzle draft', path: 'link', label: 'link' },
    { body: 'new take', path: 'name', label: 'name' },
    { body: 'outline save', path: 'script.lines.1.text', label: 'line text' },
    { body: 'outline save', path: 'script.chapters.0.title', label: 'chapter title' },
    { body: 'outline document', path: 'title', label: 'title' },
    { body: 'outline document', path: 'steps.0.text', label: 'step text' },
  ])('$body: a NUL in $path is refused with "$label can\'t contain a NUL character"', ({ body: name, path, label }) => {
    const { schema, body } = BODIES.find((b) => b.name === name)!
    const keys = path.split('.').map((k) => (/^\d+$/.test(k) ? Number(k) : k))
    const value = String(keys.reduce<unknown>((v, k) => (v as Record<string | number, unknown>)[k], body()))
    const hostile = label === 'link' ? `${value}/a\u0000b` : `a\u0000${value}`
    const result = schema.safeParse(replaceAt(body(), keys, hostile))
    expect(result.error?.issues.map((i) => i.message)).toContain(`${label} can't contain a NUL character`)
  })
})

describe('outline save', () => {
  test('outlineSaveSchema(a script whose lines skip a step) => refused without the steps', () => {
    const script = scriptOf(outline())
    const lines = script.lines.map((l, i) => (i === 2 ? { ...l, steps: l.steps.map((s) => s + 1) } : l))
    const messages = outlineSaveSchema.safeParse({ version: 1, script: { ...script, lines } }).error?.issues.map((i) => i.message)
    expect(messages?.[0]).toBe(`line ${lines[2].id} covers step ${lines[2].steps[0] + 1}, expected step ${lines[2].steps[0]}`)
  })

  test('outlineSaveSchema(a script carrying steps and a puzzle) => parsed to the script alone', () => {
    const whole = outline()
    const parsed = outlineSaveSchema.parse({ version: 1, script: whole })
    expect(Object.keys(parsed.script).sort()).toEqual(Object.keys(scriptOf(whole)).sort())
    expect(parsed.script).not.toHaveProperty('steps')
  })

  test('scriptProblems(script, a step count) => the one missing coverage when the lines stop early', () => {
    const whole = outline()
    expect(scriptProblems(whole, whole.steps.length)).toEqual([])
    expect(scriptProblems(whole, whole.steps.length + 1)).toEqual([`the lines cover ${whole.steps.length} of ${whole.steps.length + 1} steps`])
  })
})

describe('outlineSchema', () => {
  // each of these answered 500 on PATCH: the structure check ran and read lines[0] after min(1) had failed
  test.each([
    ['no lines', (o: Outline) => ({ ...o, lines: [] })],
    ['no chapters', (o: Outline) => ({ ...o, chapters: [] })],
    ['no steps', (o: Outline) => ({ ...o, steps: [] })],
    ['lines that are not a list', (o: Outline) => ({ ...o, lines: {} })],
    ['a line that is null', (o: Outline) => ({ ...o, lines: [null, ...o.lines] })],
    ['a chapter without a line', (o: Outline) => ({ ...o, chapters: [{ title: 'Start', edited: false }] })],
  ])('outlineSchema(%s) => refused with issues, never thrown', (_case, change) => {
    const result = outlineSchema.safeParse(change(outline()))
    expect(result.success).toBe(false)
    expect(result.error!.issues.length).toBeGreaterThan(0)
  })

  test('outlineSchema(lines: []) => the one issue is that there are no lines', () => {
    const result = outlineSchema.safeParse({ ...outline(), lines: [] })
    expect(result.error?.issues.map((i) => i.path.join('.'))).toEqual(['lines'])
  })

  test('outlineSchema(any part replaced by any JSON value) => never throws', () => {
    const base = outline()
    const paths = allPaths(base)
    fc.assert(
      fc.property(fc.constantFrom(...paths), fc.jsonValue({ maxDepth: 3 }), (path, value) => {
        expect(() => outlineSchema.safeParse(replaceAt(base, path, value))).not.toThrow()
      }),
      { numRuns: 500, seed: 9 },
    )
  })

  test(`outlineSchema(a line of ${LINE_TEXT_MAX + 1} characters) => refused with the limit`, () => {
    const o = outline()
    o.lines[1]!.text = 'a'.repeat(LINE_TEXT_MAX + 1)
    expect(outlineSchema.safeParse(o).error?.issues.map((i) => i.message)).toEqual([`line text can be at most ${LINE_TEXT_MAX} characters`])
  })

  test('outlineSchema(100,000 tiny lines) => refused on the count, quickly', () => {
    const o = outline()
    const many = { ...o, lines: Array.from({ length: 100_000 }, (_, i) => ({ ...o.lines[1]!, id: i + 1 })) }
    const started = performance.now()
    const result = outlineSchema.safeParse(many)
    expect(result.error?.issues.map((i) => `${i.path.join('.')}: ${i.code}`)).toEqual(['lines: too_big'])
    // generous for a slow machine: it takes a few tens of milliseconds
    expect(performance.now() - started).toBeLessThan(2000)
  })
})

type Path = (string | number)[]

/** Where a JSON Schema lets a string or an array through without a bound. */
function unbounded(node: unknown, at = '$'): string[] {
  if (typeof node !== 'object' || node === null) return []
  const n = node as Record<string, unknown>
  const found: string[] = []
  if (n.type === 'string' && n.maxLength === undefined && n.enum === undefined && n.const === undefined && !isFixedPattern(n.pattern)) found.push(at)
  if (n.type === 'array' && n.maxItems === undefined) found.push(`${at}[]`)
  for (const [key, child] of Object.entries(n)) found.push(...unbounded(child, `${at}.${key}`))
  return found
}

// a pattern without *, + or {n,} matches text of a bounded length only
const isFixedPattern = (pattern: unknown) => typeof pattern === 'string' && !/[*+]|\{\d+,\}/.test(pattern)

/** Every string in a value, with its path. */
function textLeaves(value: unknown, path: Path = []): { path: Path; value: string }[] {
  if (typeof value === 'string') return [{ path, value }]
  if (typeof value !== 'object' || value === null) return []
  return Object.entries(value).flatMap(([key, child]) => textLeaves(child, [...path, Array.isArray(value) ? Number(key) : key]))
}

/** Every path into a value, the value itself included. */
function allPaths(value: unknown, path: Path = []): Path[] {
  if (typeof value !== 'object' || value === null) return [path]
  return [path, ...Object.entries(value).flatMap(([key, child]) => allPaths(child, [...path, Array.isArray(value) ? Number(key) : key]))]
}

/** A copy of a value with the part at `path` replaced. */
function replaceAt(value: unknown, path: Path, replacement: unknown): unknown {
  if (path.length === 0) return replacement
  const [key, ...rest] = path
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>
  copy[key!] = replaceAt(copy[key!], rest, replacement)
  return copy
}
