import 'knex/types/tables'
import type { Role } from '../../shared/schemas/auth'

export interface UserRow {
  id: number
  email: string
  name: string
  password_hash: string
  created_at: Date
  updated_at: Date
}

export interface ChannelRow {
  id: number
  name: string
  slug: string
  description: string
  created_at: Date
  updated_at: Date
}

export interface MembershipRow {
  user_id: number
  channel_id: number
  role: Role
  created_at: Date
}

declare module 'knex/types/tables' {
  interface Tables {
    users: UserRow
    channels: ChannelRow
    memberships: MembershipRow
  }
}
