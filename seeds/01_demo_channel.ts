// Demo data for trying Gridcue locally: an invented channel with one person per role.
// Demo only: these passwords are public in the README; never use them for a real account.
import type { Knex } from 'knex'
import type { Role } from '../shared/schemas/auth'
import { hashPassword } from '../server/auth/passwords'
import { findChannelBySlug, insertChannel } from '../server/db/channels'
import { addMember } from '../server/db/memberships'
import { insertUser } from '../server/db/users'

export const DEMO_PASSWORD = 'gridcue-demo'
export const DEMO_CHANNEL = {
  name: 'Marigold Logic',
  slug: 'marigold-logic',
  description: 'An invented channel: calm walkthroughs of thermometer sudoku, a new episode every four days.',
}
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'owner@gridcue.example', name: 'Noor Lindqvist', role: 'owner' },
  { email: 'presenter@gridcue.example', name: 'Tomasz Ebi', role: 'presenter' },
  { email: 'editor@gridcue.example', name: 'Priya Castellanos', role: 'editor' },
  { email: 'viewer@gridcue.example', name: 'Jun Halloran', role: 'viewer' },
]

export async function seed(knex: Knex): Promise<void> {
  if (await findChannelBySlug(knex, DEMO_CHANNEL.slug)) return
  await knex.transaction(async (trx) => {
    const channel = await insertChannel(trx, DEMO_CHANNEL)
    const passwordHash = await hashPassword(DEMO_PASSWORD)
    for (const person of DEMO_USERS) {
      const user = await insertUser(trx, { email: person.email, name: person.name, password_hash: passwordHash })
      await addMember(trx, user.id, channel.id, person.role)
    }
  })
}
