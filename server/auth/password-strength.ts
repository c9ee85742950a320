import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common'
import { HttpError } from '../errors'

// zxcvbn's scores run 0–4; 3 means "safely unguessable" against an online attack slowed by hashing (its authors' reading)
const LEAST_SCORE = 3

const estimator = new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs })

// words anyone trying to guess a Gridcue password would try first
const TRADE_WORDS = ['gridcue', 'sudoku', 'thermometer', 'puzzle', 'channel']

/**
 * Refuses a password that common passwords, keyboard patterns, dates or the person's own name and address
 * would guess (a 400 with a sentence). The length limits are the schema's (shared/schemas/team.ts).
 */
export function requireStrongPassword(password: string, about: { email: string; name?: string }): void {
  const personal = [about.email, ...about.email.split(/[@.+_-]/), ...(about.name?.split(/\s+/) ?? [])].filter((word) => word.length > 2)
  const result = estimator.check(password, [...personal, ...TRADE_WORDS])
  if (result.score >= LEAST_SCORE) return
  throw new HttpError(
    400,
    'weak-password',
    'This password would be guessed too easily: it is close to common passwords, keyboard patterns, dates or your own name or address. A few unrelated words together make a strong one.',
  )
}
