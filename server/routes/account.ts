import { accountNameSchema, emailChangeSchema, passwordChangeSchema, resetPasswordSchema, resetRequestSchema } from '../../shared/schemas/team'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import type { AppLogger } from '../logger'
import { accountOf, changePassword, confirmEmailChange, renameAccount, requestEmailChange } from '../services/account'
import { describeReset, requestPasswordReset, resetPassword } from '../services/password-resets'
import type { EndpointTable } from './endpoint'

/** The signed-in person's own account, and the links mailed about it (their token is the access). */
export function accountEndpoints(api: EndpointTable, { db, config, logger }: { db: Db; config: Config; logger: AppLogger }): void {
  api.add({ method: 'get', path: '/account', access: 'signed-in' }, ({ user }) => accountOf(db, user.id))
  api.add({ method: 'patch', path: '/account', access: 'signed-in', body: accountNameSchema }, ({ user, body }) => renameAccount(db, user.id, body))
  api.add({ method: 'post', path: '/account/email', access: 'signed-in', body: emailChangeSchema, status: 202 }, ({ user, body }) => requestEmailChange(db, config.mail, user.id, body))
  api.addPublic({ method: 'post', path: '/account/email/:token' }, ({ params }) => confirmEmailChange(db, params.token))
  api.add({ method: 'put', path: '/account/password', access: 'signed-in', body: passwordChangeSchema }, ({ user, body }) => changePassword(db, config.auth, user.id, body))

  api.addPublic({ method: 'post', path: '/auth/password-reset', body: resetRequestSchema, status: 202 }, ({ body }) => requestPasswordReset(db, config.mail, logger, body))
  api.addPublic({ method: 'get', path: '/auth/password-reset/:token' }, ({ params }) => describeReset(db, params.token))
  api.addPublic({ method: 'post', path: '/auth/password-reset/:token', body: resetPasswordSchema }, ({ params, body }) => resetPassword(db, config.auth, params.token, body))
}
