import { z } from 'zod'
import { signInResponseSchema } from '@shared/schemas/auth'
import type { SignInResponse } from '@shared/schemas/auth'
import { accountSchema } from '@shared/schemas/team'
import type { Account, AccountNameInput, EmailChangeInput, PasswordChangeInput, ResetPasswordInput, ResetRequestInput } from '@shared/schemas/team'
import { http } from './http'

export const accountKeys = {
  mine: ['account'] as const,
  reset: (token: string) => ['password-reset', token] as const,
}

const messageSchema = z.object({ message: z.string() })
const emailSchema = z.object({ email: z.string() })
const resetPath = (token: string) => `/auth/password-reset/${encodeURIComponent(token)}`

export function getAccount(signal?: AbortSignal): Promise<Account> {
  return http.get('/account', accountSchema, { signal })
}

export function renameAccount(input: AccountNameInput): Promise<Account> {
  return http.patch('/account', input, accountSchema)
}

/** Mails a confirmation link to the new address; the account keeps its address until the link is followed. */
export function requestEmailChange(input: EmailChangeInput): Promise<Account> {
  return http.post('/account/email', input, accountSchema)
}

/** The link is the access, so no token goes with it (the person may be signed out, or signed in elsewhere). */
export function confirmEmailChange(token: string): Promise<{ email: string }> {
  return http.post(`/account/email/${encodeURIComponent(token)}`, undefined, emailSchema, { auth: false })
}

/** Ends every other session: the answer is this one's fresh token. */
export function changePassword(input: PasswordChangeInput): Promise<SignInResponse> {
  return http.put('/account/password', input, signInResponseSchema)
}

/** Always the same sentence, whether or not the address has an account. */
export function requestPasswordReset(input: ResetRequestInput): Promise<string> {
  return http.post('/auth/password-reset', input, messageSchema, { auth: false }).then((answer) => answer.message)
}

export function describePasswordReset(token: string, signal?: AbortSignal): Promise<{ email: string }> {
  return http.get(resetPath(token), emailSchema, { signal, auth: false })
}

export function resetPassword(token: string, input: ResetPasswordInput): Promise<SignInResponse> {
  return http.post(resetPath(token), input, signInResponseSchema, { auth: false })
}
