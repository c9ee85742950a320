import { invitationSignUpSchema } from '../../shared/schemas/team'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import { acceptInvitation, describeInvitation, signUpByInvitation } from '../services/invitations'
import type { EndpointTable } from './endpoint'

/** An invitation link's own routes: the link's token is the access, so reading it and signing up are public. */
export function invitationEndpoints(api: EndpointTable, db: Db, config: Config): void {
  api.addPublic({ method: 'get', path: '/invitations/:token' }, ({ params }) => describeInvitation(db, params.token))
  api.addPublic({ method: 'post', path: '/invitations/:token/sign-up', body: invitationSignUpSchema, status: 201 }, ({ params, body }) =>
    signUpByInvitation(db, config.auth, params.token, body),
  )
  api.add({ method: 'post', path: '/invitations/:token/accept', access: 'signed-in' }, ({ params, user }) => acceptInvitation(db, user, params.token))
}
