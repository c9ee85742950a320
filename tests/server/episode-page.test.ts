/**
 * The episode page's HTML, as a browser without JavaScript (or a link preview) gets it: the head tags, the
 * step list, the inlined data, escaping of everything the team typed, and revalidation by ETag.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Window } from 'happy-dom'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { episodePageSchema, type EpisodePublish } from '../../shared/schemas/episode'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { draftOf } from '../helpers/studio'

let take: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13', { author: 'Wren Adeyemi', link: 'https://puzzles.example/gt13' }))
    take = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
  },
})

const PAGE = '/episodes/marigold-logic/thermo-tuesday-1'

async function publish(extra: Partial<EpisodePublish> = {}): Promise<void> {
  const body: EpisodePublish = {
    slug: 'thermo-tuesday-1',
    title: 'Thermo Tuesday 1',
    visibility: 'public',
    description: 'A calm solve of a thermometer puzzle. Chapters below.',
    video: { kind: 'none' },
    ...extra,
  }
  const res = await api.as('editor').put(`/api/channels/${api.channelId}/outlines/${take.id}/episode`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
}

// happy-dom's parser, as a browser would read the page (scripts are not run)
const parseHtml = (html: string) => new new Window().DOMParser().parseFromString(html, 'text/html')
const all = (doc: ReturnType<typeof parseHtml>, selector: string) => [...doc.querySelectorAll(selector)]

const open = (path = PAGE) => api.as('anonymous').get(path).set('Host', 'gridcue.example:5180')

describe('GET /episodes/:channelSlug/:episodeSlug', () => {
  it('should hold the step list, the credits, the rules and the chapters in the HTML, without JavaScript', async () => {
    await publish()
    const res = await open()
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toBe('text/html; charset=utf-8')
    const doc = parseHtml(res.text)
    const main = doc.querySelector('main#episode')!
    expect(main.querySelector('h1')!.textContent).toBe('Thermo Tuesday 1')
    const credit = main.querySelector('.episode-static-credit')!
    expect(credit.textContent).toBe(`Puzzle: ${take.outline.title} by Wren Adeyemi`)
    expect(credit.querySelector('a')!.getAttribute('href')).toBe('https://puzzles.example/gt13')
    expect(main.textContent).toMatch(/Along each thermometer the digits climb from the bulb/)

    const shown = take.outline.lines.filter((l) => !l.hidden)
    const items = [...main.querySelectorAll('ol.episode-static-steps > li')]
    expect(items.map((li) => li.id)).toEqual(shown.map((_, i) => `step-${i + 1}`))
    expect(items[0]!.querySelector('time')!.textContent).toBe('0:00')
    expect(items[0]!.querySelector('p')!.textContent).toBe(shown[0]!.text)

    // the first line that places a digit lists it as r3c4 = 7, rows and columns counted from 1
    const placing = shown.findIndex((l) => l.steps.some((i) => take.outline.steps[i]!.placements.length > 0))
    const { cell, digit } = take.outline.steps[shown[placing]!.steps.find((i) => take.outline.steps[i]!.placements.length > 0)!]!.placements[0]!
    expect(items[placing]!.querySelector('.episode-static-placed')!.textContent).toContain(`r${Math.floor(cell / 9) + 1}c${(cell % 9) + 1} = ${digit}`)

    const chapters = [...main.querySelectorAll('ol.episode-static-chapters > li')]
    expect(chapters[0]!.textContent).toBe(`0:00 ${take.outline.chapters[0]!.title}`)
    expect(chapters[0]!.querySelector('a')!.getAttribute('href')).toBe('#step-1')
    expect(main.textContent).toContain('Times are estimated from the script')
  })

  it('should name the page in its head: title, description, canonical address and Open Graph tags', async () => {
    await publish()
    const doc = parseHtml((await open()).text)
    const meta = (selector: string) => doc.querySelector(selector)?.getAttribute('content')
    expect(doc.querySelector('title')!.textContent).toBe('Thermo Tuesday 1 · Marigold Logic')
    expect(meta('meta[name="description"]')).toBe('A calm solve of a thermometer puzzle.')
    expect(doc.querySelector('link[rel="canonical"]')!.getAttribute('href')).toBe(`http://gridcue.example:5180${PAGE}`)
    // Open Graph protocol (ogp.me): og:title, og:type, og:image and og:url are the required four
    expect(meta('meta[property="og:title"]')).toBe('Thermo Tuesday 1')
    expect(meta('meta[property="og:type"]')).toBe('video.episode')
    expect(meta('meta[property="og:url"]')).toBe(`http://gridcue.example:5180${PAGE}`)
    expect(meta('meta[property="og:image"]')).toBe('http://gridcue.example:5180/api/episodes/marigold-logic/thermo-tuesday-1/picture.png')
    expect([meta('meta[property="og:image:width"]'), meta('meta[property="og:image:height"]')]).toEqual(['1280', '720'])
    expect(meta('meta[property="og:description"]')).toBe('A calm solve of a thermometer puzzle.')
  })

  it('should inline the same data the public API gives', async () => {
    await publish()
    const doc = parseHtml((await open()).text)
    const data = JSON.parse(doc.querySelector('script#episode-data')!.textContent)
    expect(doc.querySelector('script#episode-data')!.getAttribute('type')).toBe('application/json')
    expect(episodePageSchema.parse(data)).toEqual((await api.as('anonymous').get('/api/episodes/marigold-logic/thermo-tuesday-1')).body)
  })

  it('should keep what the team typed as text: a title that tries to close the script or add markup is harmless', async () => {
    const title = 'Thermo </script><b>bold</b> & "quoted" $& $1'
    await publish({ title, description: '<img src=x onerror=alert(1)> first. Second.' })
    const res = await open()
    expect(res.text).not.toContain('<b>')
    expect(res.text).not.toContain('<img')
    const doc = parseHtml(res.text)
    expect(all(doc, 'script')).toHaveLength(1)
    expect(doc.querySelector('h1')!.textContent).toBe(title)
    expect(doc.querySelector('title')!.textContent).toBe(`${title} · Marigold Logic`)
    expect(doc.querySelector('meta[property="og:title"]')!.getAttribute('content')).toBe(title)
    const inlined = doc.querySelector('script#episode-data')!.textContent
    expect(inlined).toContain('\\u003c/script>')
    expect(JSON.parse(inlined).episode.title).toBe(title)
  })

  it('should be revalidated by its ETag: 304 when the browser holds it, never cached without asking', async () => {
    await publish()
    const first = await open()
    expect(first.headers['cache-control']).toBe('no-cache')
    expect(first.headers.etag).toBeTruthy()
    const again = await open().set('If-None-Match', first.headers.etag!)
    expect(again.status).toBe(304)
    expect(again.text).toBe('')

    await publish({ title: 'Thermo Tuesday 1, renamed' })
    expect((await open().set('If-None-Match', first.headers.etag!)).status).toBe(200)
  })

  it('should answer an address with no live episode with 404 and a plain sentence', async () => {
    for (const path of ['/episodes/marigold-logic/never-was', '/episodes/nowhere/thermo-tuesday-1']) {
      const res = await open(path)
      expect(res.status).toBe(404)
      expect(res.headers['content-type']).toMatch(/^text\/html/)
      expect(parseHtml(res.text).querySelector('main#episode')!.textContent.trim()).toBe('There is no episode at this address.')
    }
    await publish({ publishAt: new Date(Date.now() + 3600_000).toISOString() })
    const scheduled = await open()
    expect(scheduled.status).toBe(404)
    expect(scheduled.text).not.toContain('Thermo Tuesday')
  })

  it('should ask an anonymous visitor of a members-only episode to sign in, giving away nothing of it', async () => {
    await publish({ visibility: 'members' })
    const res = await open()
    expect(res.status).toBe(200)
    const doc = parseHtml(res.text)
    expect(doc.querySelector('script#episode-data')).toBeNull()
    expect(res.text).not.toContain('Thermo Tuesday')
    expect(doc.querySelector('main#episode')!.textContent).toMatch(/members only/)
    expect(doc.querySelector('main#episode a')!.getAttribute('href')).toBe(`/sign-in?redirect=${encodeURIComponent(PAGE)}`)
  })
})

describe('the built episode page', () => {
  it('should fill the built shell’s two marks, ahead of the app’s fallback to index.html', async () => {
    await publish()
    const dir = await mkdtemp(join(tmpdir(), 'gridcue-episode-shell-'))
    try {
      // the contract of the client's build: <!--episode-head--> in the head, <!--episode-body--> inside main#episode
      const shell = '<!doctype html><html lang="en"><head><!--episode-head--><script type="module" src="/assets/episode-abc.js"></script></head><body><main id="episode"><!--episode-body--></main></body></html>'
      await writeFile(join(dir, 'episode.html'), shell)
      await writeFile(join(dir, 'index.html'), '<!doctype html><title>studio</title>')
      const app = createApp({ db: api.db, config: testConfig(), engine: api.engine, clientDir: dir })
      const res = await request(app).get(PAGE)
      expect(res.status).toBe(200)
      const doc = parseHtml(res.text)
      expect(doc.querySelector('script[type="module"]')!.getAttribute('src')).toBe('/assets/episode-abc.js')
      expect(doc.querySelector('title')!.textContent).toBe('Thermo Tuesday 1 · Marigold Logic')
      expect(doc.querySelector('main#episode #step-1')).not.toBeNull()
      expect((await request(app).get('/channels/1')).text).toContain('<title>studio</title>')
    } finally {
      await rm(dir, { recursive: true, force: true })
    }
  })
})
