// Demo puzzles for the demo channel: two puzzles of our own and one outline, so the studio has
// something to show on first start. Skipped when the channel already has puzzles.
import type { Knex } from 'knex'
import { findChannelBySlug } from '../server/db/channels'
import { countPuzzles } from '../server/db/puzzles'
import { findUserByEmail } from '../server/db/users'
import { makeOutline } from '../server/services/outlines'
import { addPuzzle } from '../server/services/puzzles'
import type { Engine } from '../server/workers/engine-pool'
import { check, outline } from '../server/workers/engine-task'
import type { PuzzleDraft } from '../shared/schemas/studio'
import { DEMO_CHANNEL, DEMO_USERS } from './01_demo_channel'

// Both grids were made by Gridcue's own generator (tests/helpers/generate-thermo.ts); titles and setters are invented.
export const DEMO_PUZZLES: PuzzleDraft[] = [
  {
    // generateThermo(101, { thermometers: 0 }): a classic sudoku
    title: 'Quiet Harbour',
    author: 'Dawit Brennan',
    givens: '.7....8..9.6.82....5..1.6......24..862.9...1.3......5...2.715..417...............',
    thermometers: [],
    link: 'https://puzzles.example/quiet-harbour',
    publishedOn: '2026-11-18',
    notes: 'Gentle: singles and one locked-candidates step. Good for a short episode.',
  },
  {
    // generateThermo(13): fixture GT13 of tests/fixtures/thermo-puzzles.json
    title: 'Four Fevers',
    author: 'Ilse Marchetti',
    givens: '.3....8.16..72.......9......9..7..3....8..9.23........18.4.....762...............',
    thermometers: [
      ['r9c9', 'r8c8', 'r7c9'],
      ['r1c6', 'r1c5', 'r1c4', 'r2c3'],
      ['r3c9', 'r2c8', 'r1c8', 'r2c9'],
      ['r5c8', 'r4c7', 'r3c7'],
    ],
    link: 'https://puzzles.example/four-fevers',
    publishedOn: '2026-11-26',
    notes: 'The thermometer in the top-right box gives the first digit.',
  },
]

// A seed runs once, outside the server: the engine runs here directly instead of in the worker pool.
const inProcess: Engine = {
  check: async (puzzle) => check(puzzle),
  outline: async (task) => outline(task),
}

export async function seed(knex: Knex): Promise<void> {
  const channel = await findChannelBySlug(knex, DEMO_CHANNEL.slug)
  if (!channel || (await countPuzzles(knex, channel.id)) > 0) return
  const presenterEmail = DEMO_USERS.find((u) => u.role === 'presenter')!.email
  const presenter = await findUserByEmail(knex, presenterEmail)
  if (!presenter) return
  const user = { id: presenter.id, email: presenter.email, name: presenter.name }
  await knex.transaction(async (trx) => {
    await addPuzzle(trx, inProcess, channel.id, DEMO_PUZZLES[0], user)
    const thermo = await addPuzzle(trx, inProcess, channel.id, DEMO_PUZZLES[1], user)
    await makeOutline(trx, inProcess, channel.id, thermo.id, { name: 'First take' }, user)
  })
}
