import type { RequestHandler } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Db } from '../db/knex'
import { findRole } from '../db/memberships'
import { forbidden, HttpError, notFound } from '../errors'
import { idParams } from '../middleware/validate'

const channelIdParams = idParams('channelId')

export const ALL_ROLES: readonly Role[] = ['owner', 'presenter', 'editor', 'viewer']
/** who works on puzzles and outlines; viewers see them only through published episodes */
export const STUDIO_TEAM: readonly Role[] = ['owner', 'presenter', 'editor']
/** who creates and deletes puzzles and outlines (editors only edit outline text) */
export const STUDIO_MAKERS: readonly Role[] = ['owner', 'presenter']

/**
 * Allows the request when the signed-in user holds one of `roles` in the channel named by `:channelId`.
 * Non-members get 404, so a channel's existence is not revealed; members with another role get 403.
 */
export function requireRole(db: Db, roles: readonly Role[]): RequestHandler {
  return async (req, res, next) => {
    const parsed = channelIdParams.safeParse(req.params)
    if (!parsed.success) throw new HttpError(400, 'invalid-input', `params.channelId: ${parsed.error.issues[0]?.message}`)
    const { channelId } = parsed.data
    if (!req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in first.')
    const role = await findRole(db, req.user.id, channelId)
    if (!role) throw notFound('Channel')
    if (!roles.includes(role)) throw forbidden(`Your role in this channel (${role}) does not allow this`)
    res.locals.role = role
    next()
  }
}
