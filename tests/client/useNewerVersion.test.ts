import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { effectScope } from 'vue'
import { flushPromises } from '@vue/test-utils'
import type { OutlineRecord } from '@shared/schemas/studio'
import { useNewerVersion } from '@/composables/useNewerVersion'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import './render'

const URL = apiPath('/channels/1/outlines/31')

describe('useNewerVersion', () => {
  beforeEach(() => vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval', 'setTimeout', 'clearTimeout'] }))
  afterEach(() => vi.useRealTimers())

  it('should ask every few seconds with the last ETag, and hand on only a newer copy', async () => {
    let serverVersion = 3
    const tags: (string | null)[] = []
    api.use(
      http.get(URL, ({ request }) => {
        const asked = request.headers.get('If-None-Match')
        tags.push(asked)
        const tag = `"outline-31-${serverVersion}"`
        // RFC 9110 §13.1.2: a matching If-None-Match on a GET answers 304 Not Modified
        if (asked === tag) return new HttpResponse(null, { status: 304, headers: { ETag: tag } })
        return HttpResponse.json(recordFor(outlineFor('PE01'), { version: serverVersion }), { headers: { ETag: tag } })
      }),
    )
    const seen: OutlineRecord[] = []
    const scope = effectScope()
    scope.run(() => useNewerVersion({ channelId: 1, outlineId: 31, version: () => 3, onNewer: (r) => seen.push(r), intervalMs: 5000 }))

    await vi.advanceTimersByTimeAsync(5000)
    await flushPromises()
    await vi.advanceTimersByTimeAsync(5000)
    await flushPromises()
    expect(tags).toEqual([null, '"outline-31-3"'])
    expect(seen).toEqual([])

    serverVersion = 4
    await vi.advanceTimersByTimeAsync(5000)
    await flushPromises()
    expect(seen.map((r) => r.version)).toEqual([4])
    scope.stop()
  })
})
