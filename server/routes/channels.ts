import { Router } from 'express'
import { ALL_ROLES, requireRole } from '../auth/require-role'
import { requireUser } from '../auth/require-user'
import type { Db } from '../db/knex'
import { channelOf, channelsOf, membersOf } from '../services/channels'
import type { JwtPassport } from '../auth/passport'

export function channelRoutes(db: Db, passport: JwtPassport): Router {
  const router = Router()
  router.use(requireUser(passport))
  router.get('/', async (req, res) => {
    res.json(await channelsOf(db, req.user!.id))
  })
  router.get('/:channelId', requireRole(db, ALL_ROLES), async (req, res) => {
    res.json(await channelOf(db, req.user!.id, Number(req.params.channelId)))
  })
  router.get('/:channelId/members', requireRole(db, ['owner', 'presenter', 'editor']), async (req, res) => {
    res.json(await membersOf(db, Number(req.params.channelId)))
  })
  return router
}
