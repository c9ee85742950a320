import { meResponseSchema, signInResponseSchema } from '@shared/schemas/auth'
import type { MeResponse, SignInInput, SignInResponse } from '@shared/schemas/auth'
import { http } from './http'

export function signIn(input: SignInInput): Promise<SignInResponse> {
  // No bearer token: a stale one must not turn a wrong password into "session expired".
  return http.post('/auth/sign-in', input, signInResponseSchema, { auth: false })
}

export function getMe(signal?: AbortSignal): Promise<MeResponse> {
  return http.get('/auth/me', meResponseSchema, { signal })
}
