/**
 * Two people saving the same document at once, 50 saves each, ten in flight at any time: each save reads the
 * document, adds its own mark to it and sends it back with the version it read, as the studio does. Optimistic
 * versioning must let exactly one save through per version: every save answered 2xx is in the final document
 * (in the order of the versions it was given), no save answered 409 left a trace, and nothing answers 500.
 */
import { describe, expect, it } from 'vitest'
import { scriptOf, type Outline } from '../../shared/schemas/outline'
import type { OutlineRecord, PuzzleRecord } from '../../shared/schemas/studio'
import { editLineText } from '../../shared/script/index'
import { useApiSuite, type Actor } from '../helpers/api'
import { draftOf } from '../helpers/studio'

const SAVES_PER_CLIENT = 50
/** saves each client has on their way at any time */
const LANES = 5
const PER_LANE = SAVES_PER_CLIENT / LANES

let puzzle: PuzzleRecord
let outline: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    puzzle = await suite.createPuzzle(draftOf('GT13', { title: 'Race' }))
    outline = (await suite.as('presenter').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
  },
})
const outlinePath = () => `/api/channels/${api.channelId}/outlines/${outline.id}`
const puzzlePath = () => `/api/channels/${api.channelId}/puzzles/${puzzle.id}`

interface Attempt {
  mark: string
  status: number
  /** the error code of a refusal */
  code?: string
  /** the version the server gave an accepted save */
  version?: number
}

/**
 * Runs every client's saves side by side: each client keeps LANES saves in flight, and each save reads the
 * document and saves it with `mark` added, based on the version it read (no retry after a 409). With ten
 * saves always on their way, most find that another landed between their read and their save.
 */
async function saveTogether(clients: Actor[], saveOne: (client: Actor, mark: string) => Promise<{ status: number; body: { version?: number; code?: string } }>): Promise<Attempt[]> {
  const lanes = clients.flatMap((client, c) =>
    Array.from({ length: LANES }, async (_, lane) => {
      const attempts: Attempt[] = []
      for (let i = 0; i < PER_LANE; i++) {
        // short marks: at most 50 accepted ones must fit the title's length limit
        const mark = ` ${c * SAVES_PER_CLIENT + lane * PER_LANE + i}`
        const res = await saveOne(client, mark)
        attempts.push({ mark, status: res.status, code: res.body.code, version: res.status === 200 ? res.body.version : undefined })
      }
      return attempts
    }),
  )
  return (await Promise.all(lanes)).flat()
}

/**
 * Checks what the attempts left: the next versions, one per accepted save, and no answer other than a save or
 * a refusal in `refusals` (code by status). Returns the accepted saves' marks in version order.
 */
function expectOnlyAcceptedSaves(attempts: Attempt[], startVersion: number, finalVersion: number, refusals: Record<number, string> = { 409: 'stale' }) {
  expect(attempts.filter((a) => a.status !== 200 && refusals[a.status] !== a.code)).toEqual([])
  const accepted = attempts.filter((a) => a.status === 200).sort((a, b) => a.version! - b.version!)
  expect(accepted.length).toBeGreaterThan(0)
  expect(accepted.map((a) => a.version)).toEqual(accepted.map((_, i) => startVersion + 1 + i))
  expect(finalVersion).toBe(startVersion + accepted.length)
  return accepted.map((a) => a.mark).join('')
}

describe('concurrent saves of one document', () => {
  it('should keep every accepted outline save and refuse the rest with 409 (two clients × 50)', async () => {
    const line = outline.outline.lines[1]!
    const attempts = await saveTogether(['presenter', 'editor'], async (client, mark) => {
      const read = await api.as(client).get(outlinePath())
      const doc: Outline = read.body.outline
      const text = doc.lines.find((l) => l.id === line.id)!.text
      return api.as(client).patch(outlinePath(), { version: read.body.version, script: scriptOf(editLineText(doc, line.id, text + mark)) })
    })

    const final: OutlineRecord = (await api.as('owner').get(outlinePath())).body
    const marks = expectOnlyAcceptedSaves(attempts, outline.version, final.version)
    // the line holds each accepted save's mark, in version order, and nothing of the refused ones
    expect(final.outline.lines.find((l) => l.id === line.id)!.text).toBe(line.text + marks)
  })

  it('should keep every accepted puzzle save and refuse the rest with 409 or engine-busy (two clients × 50)', async () => {
    const attempts = await saveTogether(['owner', 'presenter'], async (client, mark) => {
      const read: PuzzleRecord = (await api.as(client).get(puzzlePath())).body
      return api.as(client).put(puzzlePath(), { title: read.title + mark, givens: read.givens, thermometers: read.thermometers, version: read.version })
    })

    const final: PuzzleRecord = (await api.as('owner').get(puzzlePath())).body
    // a puzzle save also waits for the engine's check, whose bounded queue (server/workers/task-pool.ts) turns
    // the overflow of 100 saves at once into 503 engine-busy: refused like a 409, so it must leave no trace either
    const marks = expectOnlyAcceptedSaves(attempts, puzzle.version, final.version, { 409: 'stale', 503: 'engine-busy' })
    expect(final.title).toBe(puzzle.title + marks)
  })
})
