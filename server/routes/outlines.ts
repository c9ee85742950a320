import { Router } from 'express'
import { cueSheetQuerySchema, outlineCreateSchema, outlineSaveSchema, type CueSheetQuery, type OutlineCreate, type OutlineSave } from '../../shared/schemas/studio'
import type { JwtPassport } from '../auth/passport'
import { requireRole, STUDIO_MAKERS, STUDIO_TEAM } from '../auth/require-role'
import { requireUser } from '../auth/require-user'
import type { Db } from '../db/knex'
import { idParams, validate } from '../middleware/validate'
import { cueSheetOf } from '../services/cue-sheets'
import { duplicateOutline, makeOutline, outlineOf, outlinesOf, removeOutline, saveOutline } from '../services/outlines'
import type { Engine } from '../workers/engine-pool'

type PuzzleParams = { channelId: number; puzzleId: number }
type OutlineParams = { channelId: number; outlineId: number }

/** Mounted at /api/channels/:channelId: a puzzle's outlines, and each outline by its id. */
export function outlineRoutes(db: Db, passport: JwtPassport, engine: Engine): Router {
  const router = Router({ mergeParams: true })
  const signedIn = requireUser(passport)
  const team = requireRole(db, STUDIO_TEAM)
  const makers = requireRole(db, STUDIO_MAKERS)
  const puzzle = idParams('channelId', 'puzzleId')
  const outline = idParams('channelId', 'outlineId')

  router.get('/puzzles/:puzzleId/outlines', signedIn, team, validate({ params: puzzle }), async (_req, res) => {
    const { channelId, puzzleId } = res.locals.params as PuzzleParams
    res.json(await outlinesOf(db, channelId, puzzleId))
  })
  router.post('/puzzles/:puzzleId/outlines', signedIn, makers, validate({ params: puzzle, body: outlineCreateSchema }), async (req, res) => {
    const { channelId, puzzleId } = res.locals.params as PuzzleParams
    res.status(201).json(await makeOutline(db, engine, channelId, puzzleId, res.locals.body as OutlineCreate, req.user!))
  })
  router.get('/outlines/:outlineId', signedIn, team, validate({ params: outline }), async (_req, res) => {
    const { channelId, outlineId } = res.locals.params as OutlineParams
    res.json(await outlineOf(db, channelId, outlineId))
  })
  router.patch('/outlines/:outlineId', signedIn, team, validate({ params: outline, body: outlineSaveSchema }), async (_req, res) => {
    const { channelId, outlineId } = res.locals.params as OutlineParams
    res.json(await saveOutline(db, channelId, outlineId, res.locals.body as OutlineSave))
  })
  router.get('/outlines/:outlineId/cue-sheet.pdf', signedIn, team, validate({ params: outline, query: cueSheetQuerySchema }), async (_req, res) => {
    const { channelId, outlineId } = res.locals.params as OutlineParams
    const { thumbnails } = res.locals.query as CueSheetQuery
    const { filename, pdf } = await cueSheetOf(db, channelId, outlineId, thumbnails)
    res.type('application/pdf').attachment(filename).send(pdf)
  })
  router.post('/outlines/:outlineId/duplicate', signedIn, makers, validate({ params: outline }), async (req, res) => {
    const { channelId, outlineId } = res.locals.params as OutlineParams
    res.status(201).json(await duplicateOutline(db, channelId, outlineId, req.user!))
  })
  router.delete('/outlines/:outlineId', signedIn, makers, validate({ params: outline }), async (_req, res) => {
    const { channelId, outlineId } = res.locals.params as OutlineParams
    await removeOutline(db, channelId, outlineId)
    res.status(204).end()
  })
  return router
}
