import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { ApiError, http, isApiError, setHttpAuth } from '@/api/http'
import { jsonResponse, mockApi } from './support'

const okSchema = z.object({ ok: z.boolean() })

describe('http client', () => {
  beforeEach(() => {
    setHttpAuth({ getToken: () => null, onUnauthorized: () => {} })
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('should turn a 4xx JSON error body into an ApiError with status, code, message and details', async () => {
    mockApi({
      'POST /api/things': jsonResponse(400, {
        code: 'invalid-input',
        message: 'Check the fields',
        details: [{ path: 'name', message: 'Too short' }],
      }),
    })

    const error = await http.post('/things', { name: 'x' }, okSchema).catch((e: unknown) => e)

    expect(isApiError(error)).toBe(true)
    expect(error).toBeInstanceOf(ApiError)
    expect(error).toMatchObject({
      status: 400,
      code: 'invalid-input',
      message: 'Check the fields',
      details: [{ path: 'name', message: 'Too short' }],
    })
  })

  it('should give a non-JSON error body a code and message of its own', async () => {
    mockApi({ 'GET /api/things': () => new Response('<html>Bad gateway</html>', { status: 502 }) })

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 502, code: 'http-502' })
  })

  it('should report an unreachable server as an ApiError with status 0', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')))

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 0, code: 'network-error' })
  })

  it('should parse a successful body and reject one that breaks the contract', async () => {
    mockApi({ 'GET /api/good': jsonResponse(200, { ok: true }), 'GET /api/bad': jsonResponse(200, { ok: 'yes' }) })

    await expect(http.get('/good', okSchema)).resolves.toEqual({ ok: true })
    await expect(http.get('/bad', okSchema)).rejects.toMatchObject({ code: 'unexpected-response' })
  })

  it('should send JSON with the bearer token from the registered getter', async () => {
    setHttpAuth({ getToken: () => 'secret-token', onUnauthorized: () => {} })
    const fetchMock = mockApi({ 'POST /api/things': jsonResponse(200, { ok: true }) })

    await http.post('/things', { a: 1 }, okSchema)

    const [, init] = fetchMock.mock.calls[0]!
    const headers = init?.headers as Record<string, string>
    expect(headers.Authorization).toBe('Bearer secret-token')
    expect(headers['Content-Type']).toBe('application/json')
    expect(init?.body).toBe('{"a":1}')
  })

  it('should report a 401 as the end of the session only when a token was sent', async () => {
    const onUnauthorized = vi.fn()
    let token: string | null = null
    setHttpAuth({ getToken: () => token, onUnauthorized })
    mockApi({ 'GET /api/things': jsonResponse(401, { code: 'unauthorized', message: 'Sign in' }) })

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 401 })
    expect(onUnauthorized).not.toHaveBeenCalled()

    token = 'stale'
    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 401 })
    expect(onUnauthorized).toHaveBeenCalledTimes(1)
  })
})
