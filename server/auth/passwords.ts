import bcrypt from 'bcryptjs'

/** bcrypt cost: 12 rounds ≈ 0.2 s here, slow enough to resist guessing, quick enough to sign in. */
const BCRYPT_COST = 12

export const hashPassword = (password: string) => bcrypt.hash(password, BCRYPT_COST)

// compared against when the e-mail is unknown, so both answers take the same time
const UNKNOWN_USER_HASH = bcrypt.hashSync('no-such-user', BCRYPT_COST)

export const verifyPassword = (password: string, hash: string | undefined) =>
  bcrypt.compare(password, hash ?? UNKNOWN_USER_HASH)
