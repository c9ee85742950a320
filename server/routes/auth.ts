import { signInSchema } from '../../shared/schemas/auth'
import { signInGuards } from '../auth/sign-in-limits'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import { describeMe, endAllSessions, signIn } from '../services/auth'
import type { EndpointTable } from './endpoint'

export function authEndpoints(api: EndpointTable, db: Db, config: Config): void {
  api.addPublic({ method: 'post', path: '/auth/sign-in', body: signInSchema, before: signInGuards(config.auth) }, ({ body }) => signIn(db, config.auth, body))
  // ends the caller's sessions everywhere, so a copied token stops working too
  api.add({ method: 'post', path: '/auth/sign-out', access: 'signed-in' }, ({ user }) => endAllSessions(db, user.id))
  api.add({ method: 'get', path: '/auth/me', access: 'signed-in' }, ({ user }) => describeMe(db, user))
}
