import { describe, expect, it } from 'vitest'
import { loadConfig } from '../../server/config'

const base = { DATABASE_URL: 'postgres://u@127.0.0.1:5432/db', JWT_SECRET: 'k'.repeat(32) }

describe('loadConfig', () => {
  it('should build a frozen config with defaults', () => {
    const config = loadConfig(base)
    expect(config.http).toEqual({ host: '127.0.0.1', port: 5180, behindTls: false })
    expect(config.auth).toMatchObject({ signInAttemptsPer15Min: 10, signInAttemptsPerAddressPer15Min: 30 })
    expect(Object.isFrozen(config)).toBe(true)
  })

  it('should fail fast naming every bad value', () => {
    expect(() => loadConfig({ ...base, PORT: 'eighty', JWT_SECRET: 'short' })).toThrow(
      /PORT: .*\n.*JWT_SECRET: JWT_SECRET must be at least 32 characters/s,
    )
  })

  it('should read BEHIND_TLS as a yes or no, and refuse anything else', () => {
    expect(loadConfig({ ...base, BEHIND_TLS: 'true' }).http.behindTls).toBe(true)
    expect(loadConfig({ ...base, BEHIND_TLS: '0' }).http.behindTls).toBe(false)
    expect(() => loadConfig({ ...base, BEHIND_TLS: 'maybe' })).toThrow(/BEHIND_TLS: /)
  })

  it('should explain a missing or foreign database address', () => {
    expect(() => loadConfig({ JWT_SECRET: base.JWT_SECRET })).toThrow(/DATABASE_URL is required/)
    expect(() => loadConfig({ ...base, DATABASE_URL: 'mysql://x' })).toThrow(/must start with postgres:\/\//)
  })
})
