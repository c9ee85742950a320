/**
 * Hostile bodies, generated with fast-check, against every write route the app registers (read from
 * listEndpoints, so a new route is covered as soon as it exists): wrong types, huge and empty strings,
 * NUL, lone surrogates, deep nesting, SQL and HTML metacharacters, prototype-pollution keys. None may
 * answer 5xx. Where a route stores what it was sent, the stored text is read back and must be exactly
 * what the schema accepted, and the WebVTT exports of a saved outline must carry it as text, checked by
 * webvtt-parser 2.2.0 (the W3C's webvtt.js), never as markup; its SRT captions must keep their cues
 * (subtitle 4.2.2).
 */
import fc from 'fast-check'
import type { Server } from 'node:http'
import { parseSync } from 'subtitle'
import request from 'supertest'
import pkg from 'webvtt-parser'
import entities from 'webvtt-parser/html-entities.json'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { issueToken } from '../../server/auth/tokens'
import type { EndpointInfo } from '../../server/routes/endpoint'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { scriptOf, type Outline } from '../../shared/schemas/outline'
import { outlineCreateSchema, outlineSaveSchema, puzzleDraftSchema, puzzleUpdateSchema } from '../../shared/schemas/studio'
import { captionCues } from '../../shared/script/captions'
import { publishedChapters, toSrt, toWebVttCaptions, toWebVttChapters } from '../../shared/script/index'
import { demoEmail, registeredEndpoints, useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { draftOf } from '../helpers/studio'

/** At least this many bodies in all, shared out over the write routes. */
const TOTAL_BODIES = 2000

let ids: { puzzleId: number; outlineId: number }
const api = useApiSuite({
  prepare: async (suite) => {
    // a classic puzzle: the engine finds its path in milliseconds, so the bodies that make a take stay cheap
    const puzzle = await suite.createPuzzle(draftOf('PE01', { author: 'Pat Setter', notes: 'Singles only.' }))
    const res = await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})
    if (res.status !== 201) throw new Error(`making an outline failed: ${res.status} ${JSON.stringify(res.body)}`)
    ids = { puzzleId: puzzle.id, outlineId: res.body.id }
  },
})

const writeRoutes = (await registeredEndpoints()).filter((e) => e.method !== 'get')
const runsPerRoute = Math.ceil(TOTAL_BODIES / writeRoutes.length)
const keyOf = (e: EndpointInfo) => `${e.method.toUpperCase()} ${e.path}`

// One app for the whole file, listening once (supertest would start a server for every request), with a
// low per-address sign-in limit: hostile sign-ins soon get 429 instead of each costing a password hash.
let app: Server
beforeAll(async () => {
  const config = testConfig()
  const express = createApp({ db: api.db, config: { ...config, auth: { ...config.auth, signInAttemptsPerAddressPer15Min: 3 } }, engine: api.engine, clientDir: '/nonexistent' })
  app = await new Promise<Server>((resolve) => {
    const server = express.listen(0, '127.0.0.1', () => resolve(server))
  })
})

/** What a valid request to a known route sends, built from the data as it is now (versions move on with each save). */
const VALID: Record<string, () => Promise<unknown>> = {
  'POST /api/auth/sign-in': async () => ({ email: demoEmail('owner'), password: DEMO_PASSWORD }),
  'POST /api/channels/:channelId/puzzles': async () => draftOf('PE02', { author: 'Pat Setter', link: 'https://example.com/p/2', publishedOn: '2026-03-01', notes: 'n' }),
  'PUT /api/channels/:channelId/puzzles/:puzzleId': async () => ({ ...draftOf('PE01', { author: 'Pat Setter', notes: 'n' }), version: (await read('puzzles', ids.puzzleId)).version }),
  'POST /api/channels/:channelId/puzzles/:puzzleId/outlines': async () => ({ name: 'Take 2', pace: 170, names: 'coords' }),
  'PATCH /api/channels/:channelId/outlines/:outlineId': async () => {
    const current = await read('outlines', ids.outlineId)
    return { version: current.version, name: 'Take 1', script: scriptOf(current.outline as Outline) }
  },
}

/** Routes that store what they are sent: the schema they accept it with, and where to read it back. */
const STORES: Record<string, { accept: (body: unknown) => unknown; readBack: (res: request.Response) => string; compare: (stored: Stored, sent: Sent) => void }> = {
  'POST /api/channels/:channelId/puzzles': {
    accept: (body) => puzzleDraftSchema.parse(body),
    readBack: (res) => `puzzles/${res.body.id}`,
    compare: (stored, sent) => expect(pick(stored, Object.keys(sent))).toEqual(sent),
  },
  'PUT /api/channels/:channelId/puzzles/:puzzleId': {
    accept: (body) => puzzleUpdateSchema.parse(body),
    readBack: () => `puzzles/${ids.puzzleId}`,
    compare: (stored, { version: _version, ...sent }) => expect(pick(stored, Object.keys(sent))).toEqual(sent),
  },
  'POST /api/channels/:channelId/puzzles/:puzzleId/outlines': {
    accept: (body) => outlineCreateSchema.parse(body),
    readBack: (res) => `outlines/${res.body.id}`,
    compare: (stored, sent) => {
      if (sent.name !== undefined) expect(stored.name).toBe(sent.name)
    },
  },
  'PATCH /api/channels/:channelId/outlines/:outlineId': {
    accept: (body) => outlineSaveSchema.parse(body),
    readBack: () => `outlines/${ids.outlineId}`,
    compare: (stored, sent) => {
      if (sent.name !== undefined) expect(stored.name).toBe(sent.name)
      const saved = stored.outline as Outline
      // the script is what was sent; the engine's part stays as stored
      expect(scriptOf(saved)).toEqual(sent.script)
      expectExportsAsText(saved)
    },
  },
}
type Stored = Record<string, unknown>
type Sent = Record<string, unknown>

describe.each(writeRoutes.map((e) => ({ route: keyOf(e), endpoint: e })))('$route', ({ route, endpoint }) => {
  it(`should answer ${runsPerRoute} hostile bodies without a 5xx, storing any text exactly as accepted`, async () => {
    const statuses = new Map<number, number>()
    await fc.assert(
      fc.asyncProperty(hostileBody(route in VALID), async (spoil) => {
        const body = spoiled(await VALID[route]?.(), spoil)
        const res = await send(endpoint, body)
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1)
        expect(res.status, `${route} ${shown(body)} → ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500)
        const store = STORES[route]
        if (store && res.status < 300 && body.value !== undefined) {
          const stored = await read(store.readBack(res))
          store.compare(stored, store.accept(body.value) as Sent)
        }
      }),
      { numRuns: runsPerRoute, seed: 9, endOnFailure: true },
    )
    // the bodies are hostile, but not all refused: some reach the handler (and, where it stores, get stored)
    expect([...statuses.keys()].some((s) => s < 300) || !(route in VALID), JSON.stringify([...statuses])).toBe(true)
  }, 60_000)
})

describe('the inputs the attack run found', () => {
  const patchOutline = async (change: (o: Outline) => Outline) => {
    const { version, outline } = await read('outlines', ids.outlineId)
    return request(app).patch(path(`outlines/${ids.outlineId}`)).set('Authorization', await ownerBearer()).send({ version, script: scriptOf(change(outline as Outline)) })
  }
  const withLine = (text: string) => (o: Outline) => ({ ...o, lines: o.lines.map((l, i) => (i === 1 ? { ...l, text } : l)) })

  it.each([
    ['no lines', (o: Outline) => ({ ...o, lines: [] }), 'body.script.lines: Too small: expected array to have >=1 items'],
    ['a lone surrogate in a line', withLine('bulb \ud83c first'), "body.script.lines.1.text: line text can't contain half of a UTF-16 surrogate pair (a broken character)"],
    ['a NUL in a line', withLine('bulb\u0000first'), "body.script.lines.1.text: line text can't contain a NUL character"],
    ['a line of one 20,000-character word', withLine('w'.repeat(20_000)), 'body.script.lines.1.text: line text can be at most 2000 characters'],
  ])('PATCH of an outline with %s → 400 naming the field (was 500, or a 24 s cue sheet)', async (_case, change, message) => {
    const res = await patchOutline(change)
    expect({ status: res.status, message: res.body.message }).toEqual({ status: 400, message })
  })

  it.each([
    ['title', { title: 'Four Fevers\u0000' }, "body.title: title can't contain a NUL character"],
    ['notes', { notes: 'a\u0000b' }, "body.notes: notes can't contain a NUL character"],
    ['author', { author: 'Pat \udc00' }, "body.author: author can't contain half of a UTF-16 surrogate pair (a broken character)"],
    ['link', { link: 'https://example.com/\u0000' }, "body.link: link can't contain a NUL character"],
  ])('PUT of a puzzle with a NUL or lone surrogate in its %s → 400 naming the field (was 500)', async (_field, change, message) => {
    const { version } = await read('puzzles', ids.puzzleId)
    const res = await request(app)
      .put(path(`puzzles/${ids.puzzleId}`))
      .set('Authorization', await ownerBearer())
      .send({ ...draftOf('PE01'), version, ...change })
    expect({ status: res.status, message: res.body.message }).toEqual({ status: 400, message })
  })
})

describe('text that looks like markup', () => {
  it('should be stored byte for byte and exported to WebVTT as text, not as tags', async () => {
    const { version, outline } = await read('outlines', ids.outlineId)
    const doc = outline as Outline
    const markup = '<b>bold</b> & <i lang="x">italic</i> --> <c.red>cue</c> &amp; <v Ada>voice</v>'
    // a blank line ends a cue: what follows would be read as a note and a cue of the attacker's timing
    const blocks = 'Look here\n\nNOTE hidden\n\n00:00:01.000 --> 00:09:00.000\nfake cue'
    const texts = [markup, blocks]
    const lines = doc.lines.map((l, i) => (i === 1 || i === 2 ? { ...l, text: texts[i - 1]! } : l))
    const chapters = doc.chapters.map((c, i) => (i === 0 ? { ...c, title: '<b>Start</b> &\n\ngo' } : c))
    const res = await request(app)
      .patch(path(`outlines/${ids.outlineId}`))
      .set('Authorization', await ownerBearer())
      .send({ version, script: scriptOf({ ...doc, lines, chapters }) })
    expect(res.status, JSON.stringify(res.body)).toBe(200)

    const saved = (await read('outlines', ids.outlineId)).outline as Outline
    expect(saved.lines.slice(1, 3).map((l) => l.text)).toEqual(texts)
    expect(saved.chapters[0]!.title).toBe('<b>Start</b> &\n\ngo')
    expectExportsAsText(saved)
  })
})

afterAll(async () => {
  await new Promise((resolve) => app?.close(resolve))
  // no body managed to give every object a new property through a "__proto__" or "constructor" key
  expect(Object.keys(Object.prototype)).toEqual([])
  expect(({} as Record<string, unknown>).polluted).toBeUndefined()
})

// ---- hostile bodies ----------------------------------------------------------------------------

/** A body as it goes on the wire, and the value it stands for when there is one (deep nesting is built as text). */
interface Body {
  json: string | undefined
  value?: unknown
}

const HOSTILE_TEXT = [
  '',
  ' ',
  '\u0000',
  'title\u0000',
  '\ud800',
  'x\udfff',
  '\udc00\ud800',
  "' OR '1'='1",
  "'); DROP TABLE puzzles; --",
  '"; SELECT pg_sleep(5); --',
  '\\',
  '%00',
  '<script>alert(1)</script>',
  '<b>bold</b> & <i>',
  '"><img src=x onerror=alert(1)>',
  'javascript:alert(1)',
  '--> 00:00.000 --> 00:05.000',
  'NOTE\n\nWEBVTT',
  'a\r\n\r\nb',
  '${7*7} {{7*7}} <%= 7*7 %>',
  '\u202eevil\u202c',
  '🌡️🧩 emoji ZWJ 👩‍👩‍👧',
  'e\u0301 combining',
  '\ufeffbom',
]

const huge = (n: number) => 'x'.repeat(n)

const hostileString = fc.oneof(
  fc.constantFrom(...HOSTILE_TEXT),
  fc.constantFrom(huge(201), huge(2001), huge(5001), huge(300_000)),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.integer({ min: 0xd800, max: 0xdfff }).map((unit) => `lone ${String.fromCharCode(unit)} half`),
)

const pollutingKey = fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'polluted')

const { hostileValue } = fc.letrec((tie) => ({
  hostileValue: fc.oneof(
    { depthSize: 'small', maxDepth: 3 },
    hostileString,
    fc.oneof(fc.integer(), fc.double(), fc.constantFrom(0, -1, 2 ** 31, -(2 ** 53), 1e308, 0.5)),
    fc.boolean(),
    fc.constant(null),
    fc.array(tie('hostileValue'), { maxLength: 4 }),
    fc.dictionary(fc.oneof(fc.string({ maxLength: 8 }), pollutingKey), tie('hostileValue'), { maxKeys: 4 }),
    fc.constant({ __proto__: { polluted: true }, constructor: { prototype: { polluted: true } } }),
  ),
}))

/** How to spoil a valid body (or, for routes without one, an empty object); data, so a failure prints readably. */
type Spoil =
  | { replace: 'whole'; value: unknown }
  | { replace: 'part' | 'text' | 'words'; n: number; value: unknown }
  | { add: Record<string, unknown> }
  | { nest: number }

function hostileBody(hasValidBody: boolean): fc.Arbitrary<Spoil> {
  const whole = hostileValue.map((value): Spoil => ({ replace: 'whole', value }))
  const added = fc
    .dictionary(fc.oneof(fc.string({ maxLength: 8 }), pollutingKey), hostileValue, { minKeys: 1, maxKeys: 3 })
    .map((add): Spoil => ({ add }))
  const deep = fc.integer({ min: 50, max: 200_000 }).map((nest): Spoil => ({ nest }))
  if (!hasValidBody) return fc.oneof(whole, added, deep)
  const at = (replace: 'part' | 'text' | 'words', value: fc.Arbitrary<unknown>) =>
    fc.tuple(fc.nat(), value).map(([n, v]): Spoil => ({ replace, n, value: v }))
  return fc.oneof(
    // text with a space in it is what people write (titles, notes, script lines), not ids or enum values
    { arbitrary: at('words', hostileString), weight: 3 },
    { arbitrary: at('text', hostileString), weight: 2 },
    { arbitrary: at('part', hostileValue), weight: 2 },
    { arbitrary: whole, weight: 1 },
    { arbitrary: added, weight: 1 },
    { arbitrary: deep, weight: 1 },
  )
}

function spoiled(valid: unknown, spoil: Spoil): Body {
  if ('nest' in spoil) return deepBody(valid, spoil.nest)
  if ('add' in spoil) return asBody(withKeys(valid ?? {}, spoil.add))
  if (spoil.replace === 'whole') return asBody(spoil.value)
  const paths = { part: allPaths(valid), text: textPaths(valid), words: textPaths(valid, / /) }[spoil.replace]
  return asBody(replaceAt(valid, pick1(paths, spoil.n), spoil.value))
}

function asBody(value: unknown): Body {
  return { json: JSON.stringify(value), value }
}

/** The body with a first field (or the whole of it) nested `depth` arrays deep, written as JSON text. */
function deepBody(valid: unknown, depth: number): Body {
  const nested = `${'['.repeat(depth)}"deep"${']'.repeat(depth)}`
  const key = typeof valid === 'object' && valid !== null ? Object.keys(valid)[0] : undefined
  if (key === undefined) return { json: nested }
  const rest = JSON.stringify(valid).slice(1)
  return { json: `{${JSON.stringify(key)}:${nested},${rest}` }
}

function withKeys(valid: unknown, extra: Record<string, unknown>): unknown {
  if (typeof valid !== 'object' || valid === null || Array.isArray(valid)) return extra
  // defineProperty, so "__proto__" becomes a key on the wire rather than the prototype here
  const copy: Record<string, unknown> = { ...valid }
  for (const [key, value] of Object.entries(extra)) Object.defineProperty(copy, key, { value, enumerable: true, writable: true, configurable: true })
  return copy
}

type Path = (string | number)[]

const pick1 = <T,>(items: T[], n: number): T => items[n % items.length]!

function allPaths(value: unknown, at: Path = []): Path[] {
  if (typeof value !== 'object' || value === null) return [at]
  return [at, ...Object.entries(value).flatMap(([key, child]) => allPaths(child, [...at, Array.isArray(value) ? Number(key) : key]))]
}

/** Paths to the strings in a value (those matching `like`, when given); the value itself when there are none. */
function textPaths(value: unknown, like?: RegExp): Path[] {
  const paths: Path[] = []
  const visit = (v: unknown, at: Path) => {
    if (typeof v === 'string' && (!like || like.test(v))) paths.push(at)
    else if (typeof v === 'object' && v !== null) for (const [key, child] of Object.entries(v)) visit(child, [...at, Array.isArray(v) ? Number(key) : key])
  }
  visit(value, [])
  return paths.length ? paths : [[]]
}

function replaceAt(value: unknown, at: Path, replacement: unknown): unknown {
  if (at.length === 0) return replacement
  const [key, ...rest] = at
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>
  copy[key!] = replaceAt(copy[key!], rest, replacement)
  return copy
}

// ---- requests ----------------------------------------------------------------------------------

/** The owner (who may call every route), at their current token version: a generated sign-out must not end the run. */
async function ownerBearer(): Promise<string> {
  const { id } = api.user('owner')
  const { token_version } = (await api.db('users').where({ id }).first())!
  return `Bearer ${issueToken(id, testConfig().auth, token_version).token}`
}

const path = (below: string) => `/api/channels/${api.channelId}/${below}`

async function send(endpoint: EndpointInfo, body: Body) {
  const url = endpoint.path.replace(/:(\w+)/g, (_, name: string) => String({ channelId: api.channelId, ...ids }[name] ?? name))
  const req = request(app)[endpoint.method](url).set('Authorization', await ownerBearer())
  return body.json === undefined ? req : req.set('Content-Type', 'application/json').send(body.json)
}

/** A record as the API reads it back, by its path below the demo channel or by table and id. */
async function read(below: string): Promise<Stored>
async function read(kind: 'puzzles' | 'outlines', id: number): Promise<Stored>
async function read(kind: string, id?: number): Promise<Stored> {
  const res = await request(app).get(path(id === undefined ? kind : `${kind}/${id}`)).set('Authorization', await ownerBearer())
  if (res.status !== 200) throw new Error(`reading ${kind} back failed: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body
}

const pick = (record: Stored, keys: string[]) => Object.fromEntries(keys.map((k) => [k, record[k]]))

function shown(body: Body): string {
  const text = body.json ?? ''
  return text.length > 200 ? `${text.slice(0, 200)}… (${text.length} characters)` : text
}

// ---- exports -----------------------------------------------------------------------------------

const { WebVTTParser } = pkg
interface ParsedCue {
  text: string
  tree: { children: { type: string; value?: string }[] }
}
const vtt = (text: string, mode?: string) => new WebVTTParser(entities).parse(text, mode) as { cues: ParsedCue[]; errors: { message: string }[] }
const flat = (s: string) => s.replace(/\s+/g, ' ').trim()

/** Both WebVTT exports parse cleanly, every cue is plain text (no tags), and it says the stored words. */
function expectExportsAsText(outline: Outline): void {
  const captioned = new Set(captionCues(outline).map((c) => c.lineId))
  const spoken = outline.lines.filter((l) => captioned.has(l.id)).map((l) => l.text)
  const titles = publishedChapters(outline).map((c) => c.title)
  for (const [parsed, words] of [
    [vtt(toWebVttCaptions(outline)), spoken],
    [vtt(toWebVttChapters(outline), 'chapters'), titles],
  ] as const) {
    expect(parsed.errors).toEqual([])
    for (const cue of parsed.cues) expect(cue.tree.children.map((n) => n.type)).toEqual(cue.tree.children.map(() => 'text'))
    expect(flat(parsed.cues.map((c) => c.tree.children.map((n) => n.value ?? '').join('')).join(' '))).toBe(flat(words.join(' ')))
  }
  // SRT has no escapes, but a blank line ends its cues too: the same cues, the same words (subtitle 4.2.2's parser),
  // except that what a player would obey as formatting (an HTML-like tag, a braced override code; common
  // practice) goes out with look-alike brackets
  const srt = parseSync(toSrt(outline)).flatMap((n) => (n.type === 'cue' ? [n.data.text] : []))
  const asShown = (text: string) => text.replace(/<(\/?[a-z][^<>]*)>/gi, '‹$1›').replace(/\{\\/g, '{')
  expect(srt).toEqual(captionCues(outline).map((c) => asShown(c.rows.join('\n'))))
  // and the words are all there: only brackets (and an override code's backslash) differ
  const words = (text: string) => flat(text).replace(/[<>‹›]/g, '').replace(/\{\\/g, '{')
  expect(words(srt.join(' '))).toBe(words(spoken.join(' ')))
}
