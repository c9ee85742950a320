import { puzzleDraftSchema, puzzleUpdateSchema } from '../../shared/schemas/studio'
import type { Db } from '../db/knex'
import { addPuzzle, puzzleOf, puzzlesOf, removePuzzle, savePuzzle } from '../services/puzzles'
import type { Engine } from '../workers/engine-pool'
import type { EndpointTable } from './endpoint'

const puzzles = '/channels/:channelId/puzzles'
const puzzle = '/channels/:channelId/puzzles/:puzzleId'

export function puzzleEndpoints(api: EndpointTable, db: Db, engine: Engine): void {
  api.add({ method: 'get', path: puzzles, access: 'puzzle.read' }, ({ params }) => puzzlesOf(db, params.channelId))
  api.add({ method: 'post', path: puzzles, access: 'puzzle.edit', body: puzzleDraftSchema, status: 201 }, ({ params, body, user }) =>
    addPuzzle(db, engine, params.channelId, body, user),
  )
  api.add({ method: 'get', path: puzzle, access: 'puzzle.read' }, ({ params }) => puzzleOf(db, params.channelId, params.puzzleId))
  api.add({ method: 'put', path: puzzle, access: 'puzzle.edit', body: puzzleUpdateSchema }, ({ params, body }) =>
    savePuzzle(db, engine, params.channelId, params.puzzleId, body),
  )
  api.add({ method: 'delete', path: puzzle, access: 'puzzle.edit' }, ({ params }) => removePuzzle(db, params.channelId, params.puzzleId))
}
