import { meResponseSchema, signInResponseSchema } from '@shared/schemas/auth'
import type { MeResponse, SignInInput, SignInResponse } from '@shared/schemas/auth'
import { http, noContent } from './http'

export function signIn(input: SignInInput): Promise<SignInResponse> {
  // No bearer token: a stale one must not turn a wrong password into "session expired".
  return http.post('/auth/sign-in', input, signInResponseSchema, { auth: false })
}

export function getMe(signal?: AbortSignal): Promise<MeResponse> {
  return http.get('/auth/me', meResponseSchema, { signal })
}

/** Ends the session on the server, so the token stops working even where a copy of it was kept. */
export function signOut(): Promise<void> {
  return http.post('/auth/sign-out', undefined, noContent)
}
