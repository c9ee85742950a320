import type { Role } from '../../shared/schemas/auth'

declare global {
  namespace Express {
    interface User {
      id: number
      email: string
      name: string
    }
    interface Locals {
      /** the signed-in user's role in the channel named by :channelId, set by requireRole */
      role?: Role
      body?: unknown
      query?: unknown
      params?: unknown
    }
  }
}
export {}
