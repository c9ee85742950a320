import { beforeEach, describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { ApiError, http, isApiError, setHttpAuth } from '@/api/http'
import { api, apiPath, http as mock, HttpResponse } from './msw'

const okSchema = z.object({ ok: z.boolean() })

describe('http client', () => {
  beforeEach(() => {
    setHttpAuth({ getToken: () => null, onUnauthorized: () => {} })
  })

  it('should turn a 4xx JSON error body into an ApiError with status, code, message and details', async () => {
    api.use(
      mock.post(apiPath('/things'), () =>
        HttpResponse.json({ code: 'invalid-input', message: 'Check the fields', details: [{ path: 'name', message: 'Too short' }] }, { status: 400 }),
      ),
    )

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
    api.use(mock.get(apiPath('/things'), () => new HttpResponse('<html>Bad gateway</html>', { status: 502, headers: { 'Content-Type': 'text/html' } })))

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 502, code: 'http-502', message: 'Something went wrong on the server. Try again in a moment.' })
  })

  it('should report an unreachable server as an ApiError with status 0', async () => {
    api.use(mock.get(apiPath('/things'), () => HttpResponse.error()))

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 0, code: 'network-error' })
  })

  it('should parse a successful body and reject one that breaks the contract', async () => {
    api.use(
      mock.get(apiPath('/good'), () => HttpResponse.json({ ok: true })),
      mock.get(apiPath('/bad'), () => HttpResponse.json({ ok: 'yes' })),
    )

    await expect(http.get('/good', okSchema)).resolves.toEqual({ ok: true })
    await expect(http.get('/bad', okSchema)).rejects.toMatchObject({ code: 'unexpected-response' })
  })

  it('should send JSON with the bearer token from the registered getter', async () => {
    setHttpAuth({ getToken: () => 'secret-token', onUnauthorized: () => {} })
    const seen: { authorization: string | null; contentType: string | null; body: string }[] = []
    api.use(
      mock.post(apiPath('/things'), async ({ request }) => {
        seen.push({ authorization: request.headers.get('Authorization'), contentType: request.headers.get('Content-Type'), body: await request.text() })
        return HttpResponse.json({ ok: true })
      }),
    )

    await http.post('/things', { a: 1 }, okSchema)

    expect(seen).toEqual([{ authorization: 'Bearer secret-token', contentType: 'application/json', body: '{"a":1}' }])
  })

  it('should report a 401 as the end of the session only when a token was sent', async () => {
    const onUnauthorized = vi.fn()
    let token: string | null = null
    setHttpAuth({ getToken: () => token, onUnauthorized })
    api.use(mock.get(apiPath('/things'), () => HttpResponse.json({ code: 'unauthorized', message: 'Sign in' }, { status: 401 })))

    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 401 })
    expect(onUnauthorized).not.toHaveBeenCalled()

    token = 'stale'
    await expect(http.get('/things', okSchema)).rejects.toMatchObject({ status: 401 })
    expect(onUnauthorized).toHaveBeenCalledTimes(1)
  })
})
