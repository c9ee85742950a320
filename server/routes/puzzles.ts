import { Router } from 'express'
import { puzzleDraftSchema, puzzleUpdateSchema, type PuzzleDraft, type PuzzleUpdate } from '../../shared/schemas/studio'
import type { JwtPassport } from '../auth/passport'
import { requireRole, STUDIO_MAKERS, STUDIO_TEAM } from '../auth/require-role'
import { requireUser } from '../auth/require-user'
import type { Db } from '../db/knex'
import { idParams, validate } from '../middleware/validate'
import { addPuzzle, puzzleOf, puzzlesOf, removePuzzle, savePuzzle } from '../services/puzzles'
import type { Engine } from '../workers/engine-pool'

type ChannelParams = { channelId: number }
type PuzzleParams = ChannelParams & { puzzleId: number }

/** Mounted at /api/channels/:channelId/puzzles. */
export function puzzleRoutes(db: Db, passport: JwtPassport, engine: Engine): Router {
  const router = Router({ mergeParams: true })
  const signedIn = requireUser(passport)
  const team = requireRole(db, STUDIO_TEAM)
  const makers = requireRole(db, STUDIO_MAKERS)
  const channel = idParams('channelId')
  const puzzle = idParams('channelId', 'puzzleId')

  router.get('/', signedIn, team, validate({ params: channel }), async (_req, res) => {
    const { channelId } = res.locals.params as ChannelParams
    res.json(await puzzlesOf(db, channelId))
  })
  router.post('/', signedIn, makers, validate({ params: channel, body: puzzleDraftSchema }), async (req, res) => {
    const { channelId } = res.locals.params as ChannelParams
    res.status(201).json(await addPuzzle(db, engine, channelId, res.locals.body as PuzzleDraft, req.user!))
  })
  router.get('/:puzzleId', signedIn, team, validate({ params: puzzle }), async (_req, res) => {
    const { channelId, puzzleId } = res.locals.params as PuzzleParams
    res.json(await puzzleOf(db, channelId, puzzleId))
  })
  router.put('/:puzzleId', signedIn, makers, validate({ params: puzzle, body: puzzleUpdateSchema }), async (_req, res) => {
    const { channelId, puzzleId } = res.locals.params as PuzzleParams
    res.json(await savePuzzle(db, engine, channelId, puzzleId, res.locals.body as PuzzleUpdate))
  })
  router.delete('/:puzzleId', signedIn, makers, validate({ params: puzzle }), async (_req, res) => {
    const { channelId, puzzleId } = res.locals.params as PuzzleParams
    await removePuzzle(db, channelId, puzzleId)
    res.status(204).end()
  })
  return router
}
