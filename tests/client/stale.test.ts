import { describe, expect, it } from 'vitest'
import { scriptOf } from '@shared/schemas/outline'
import type { OutlineRecord } from '@shared/schemas/studio'
import { isApiError } from '@/api/http'
import { saveOutline } from '@/api/outlines'
import { isStaleError } from '@/api/stale'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'

const OUTLINE_URL = apiPath('/channels/1/outlines/31')
const doc = outlineFor('PE01')
const mine = { version: 3, script: scriptOf(doc) }
const theirs = recordFor({ ...doc, pace: doc.pace + 20 }, { version: 4 })

/** The 409 the server sends for a stale version (StaleBody in shared/schemas/studio.ts), with `details` as given. */
const staleAnswer = (details?: unknown) => HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details }, { status: 409 })

/** Serves GET for the outline and counts the requests. */
function serveCurrent(record: OutlineRecord): { gets: number } {
  const seen = { gets: 0 }
  api.use(
    http.get(OUTLINE_URL, () => {
      seen.gets++
      return HttpResponse.json(record)
    }),
  )
  return seen
}

describe('saving an outline over a newer version (the API layer owns the 409)', () => {
  it("should reject with a StaleError carrying the server's copy sent in the 409", async () => {
    api.use(http.patch(OUTLINE_URL, () => staleAnswer({ current: theirs })))
    const seen = serveCurrent(theirs)

    const error = await saveOutline(1, 31, mine).catch((e: unknown) => e)

    expect(isStaleError<OutlineRecord>(error)).toBe(true)
    expect(error).toMatchObject({ status: 409, code: 'stale', message: 'Someone saved first.', current: theirs })
    expect(seen.gets).toBe(0)
  })

  it("should fetch the server's copy when the 409 doesn't carry one, or carries one that breaks the contract", async () => {
    const seen = serveCurrent(theirs)
    for (const details of [undefined, { current: { version: 'four' } }]) {
      api.use(http.patch(OUTLINE_URL, () => staleAnswer(details)))
      const error = await saveOutline(1, 31, mine).catch((e: unknown) => e)
      expect(isStaleError<OutlineRecord>(error) && error.current).toEqual(theirs)
    }
    expect(seen.gets).toBe(2)
  })

  it('should pass any other refusal through as it came', async () => {
    api.use(http.patch(OUTLINE_URL, () => HttpResponse.json({ code: 'forbidden', message: 'Not for viewers' }, { status: 403 })))

    const error = await saveOutline(1, 31, mine).catch((e: unknown) => e)

    expect(isStaleError(error)).toBe(false)
    expect(isApiError(error) && error.status).toBe(403)
  })

  it('should resolve to the saved summary when the version is current', async () => {
    const { outline: _kept, ...summary } = recordFor(doc, { version: 4 })
    api.use(http.patch(OUTLINE_URL, () => HttpResponse.json(summary)))

    await expect(saveOutline(1, 31, mine)).resolves.toEqual(summary)
  })
})
