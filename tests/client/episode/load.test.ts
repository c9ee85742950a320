import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { SESSION_STORAGE_KEY } from '@/stores/session'
import { SAVED_SESSION_KEY } from '@/episode/api'
import { loadEpisode } from '@/episode/load'
import { api, http, HttpResponse } from '../msw'
import { sessionFixture } from '../support'
import { episodePageFor } from './page-fixture'

const page = episodePageFor('PE01')
const PATH = '/episodes/quince-street/thermo-night-7'

/** The storage the studio app saves its session in, holding a valid sign-in or nothing. */
function storageWith(signedIn: boolean) {
  return { getItem: (key: string) => (signedIn && key === SESSION_STORAGE_KEY ? JSON.stringify(sessionFixture()) : null) }
}

beforeEach(() => window.history.replaceState(null, '', `${PATH}?t=30#step-2`))
afterEach(() => {
  document.body.innerHTML = ''
})

describe('loadEpisode', () => {
  it('should read the studio app\'s saved session under the key the app writes', () => {
    expect(SAVED_SESSION_KEY).toBe(SESSION_STORAGE_KEY)
  })

  it('should start from the data the server inlined, without a request', async () => {
    document.body.innerHTML = `<main id="episode"><script type="application/json" id="episode-data">${JSON.stringify(page).replaceAll('<', '\\u003c')}</script></main>`
    expect(await loadEpisode(document, storageWith(true))).toEqual({ kind: 'page', page, fetched: false })
  })

  it('should ask the API with the saved sign-in when the server sent no data (a members-only episode)', async () => {
    let sent: string | null = null
    api.use(
      http.get(`${location.origin}/api/episodes/quince-street/thermo-night-7`, ({ request }) => {
        sent = request.headers.get('authorization')
        return HttpResponse.json(page)
      }),
    )
    document.body.innerHTML = '<main id="episode"><p data-episode-state="members-only">For members</p></main>'
    expect(await loadEpisode(document, storageWith(true))).toEqual({ kind: 'page', page, fetched: true })
    expect(sent).toBe(`Bearer ${sessionFixture().token}`)
  })

  it('should say there is no episode when the API answers 404 to a signed-in person', async () => {
    api.use(http.get(`${location.origin}/api/episodes/quince-street/thermo-night-7`, () => HttpResponse.json({ code: 'not-found', message: 'There is no episode at this address.' }, { status: 404 })))
    document.body.innerHTML = '<main id="episode"><p data-episode-state="members-only">For members</p></main>'
    expect(await loadEpisode(document, storageWith(true))).toEqual({ kind: 'missing' })
  })

  it('should send someone not signed in to sign in and back to this very address, for a members-only episode', async () => {
    document.body.innerHTML = '<main id="episode"><p data-episode-state="members-only">For members</p></main>'
    expect(await loadEpisode(document, storageWith(false))).toEqual({ kind: 'members-only', signInHref: `/sign-in?redirect=${encodeURIComponent(`${PATH}?t=30#step-2`)}` })
  })

  it('should leave the server\'s own page alone for an address with no episode', async () => {
    document.body.innerHTML = '<main id="episode"><p data-episode-state="missing">There is no episode at this address.</p></main>'
    expect(await loadEpisode(document, storageWith(false))).toBeNull()
  })

  it('should turn a server failure into a message instead of a blank page', async () => {
    api.use(http.get(`${location.origin}/api/episodes/quince-street/thermo-night-7`, () => HttpResponse.json({ code: 'database-unavailable', message: 'Try again.' }, { status: 503 })))
    document.body.innerHTML = '<main id="episode"></main>'
    const start = await loadEpisode(document, storageWith(true))
    expect(start).toMatchObject({ kind: 'failed', message: expect.stringMatching(/answered 503/) })
  })
})
