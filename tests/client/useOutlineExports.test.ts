import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import pkg from 'webvtt-parser'
import { useOutlineExports } from '@/composables/useOutlineExports'
import { outlineFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'

const { WebVTTParser } = pkg

interface Download {
  name: string
  blob: Blob
}

let downloads: Download[]
beforeEach(() => {
  downloads = []
  const blobs = new Map<string, Blob>()
  vi.spyOn(URL, 'createObjectURL').mockImplementation((blob) => {
    const url = `blob:test/${blobs.size}`
    blobs.set(url, blob as Blob)
    return url
  })
  vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {})
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    downloads.push({ name: this.download, blob: blobs.get(this.getAttribute('href')!)! })
  })
})
afterEach(() => {
  vi.restoreAllMocks()
})

function setup(saveFirst = vi.fn(async () => {})) {
  const doc = outlineFor('PE01')
  const exports = useOutlineExports({
    channelId: () => 1,
    outlineId: () => 31,
    outline: () => doc,
    take: () => 'First take',
    saveFirst,
  })
  return { doc, exports, saveFirst }
}

describe('useOutlineExports', () => {
  it('should download WebVTT chapters of the current document that a third-party WebVTT parser reads', async () => {
    const { exports } = setup()
    await exports.exportAs('vtt-chapters')
    expect(downloads).toHaveLength(1)
    expect(downloads[0]!.name).toBe('project-euler-96-grid-01-first-take-chapters.vtt')
    // webvtt-parser (npm) implements the W3C WebVTT parsing rules
    const parsed = new WebVTTParser().parse(await downloads[0]!.blob.text(), 'metadata')
    expect(parsed.errors).toEqual([])
    expect(parsed.cues[0].startTime).toBe(0)
    expect(parsed.cues.length).toBeGreaterThan(1)
  })

  it('should put the setter credit and chapter lines starting at 0:00 in the description', async () => {
    const { exports } = setup()
    await exports.exportAs('description')
    const text = await downloads[0]!.blob.text()
    // common practice: chapter lines in a video description are "m:ss Title", the first at 0:00
    expect(text).toMatch(/^0:00 \S/m)
    expect(downloads[0]!.name).toBe('project-euler-96-grid-01-first-take-description.txt')
  })

  it('should save pending edits before asking the server for the cue sheet with grids', async () => {
    const asked: string[] = []
    api.use(
      http.get(apiPath('/channels/1/outlines/31/cue-sheet.pdf'), ({ request }) => {
        asked.push(new URL(request.url).search)
        return new HttpResponse(new Blob(['%PDF-1.3 test']), { headers: { 'Content-Type': 'application/pdf' } })
      }),
    )
    const { exports, saveFirst } = setup()
    await exports.exportAs('cue-sheet-grids')
    expect(saveFirst).toHaveBeenCalledOnce()
    expect(asked).toEqual(['?thumbnails=1'])
    expect(downloads[0]!.name).toBe('project-euler-96-grid-01-first-take-cue-sheet.pdf')
    expect(await downloads[0]!.blob.text()).toBe('%PDF-1.3 test')
  })

  it('should show the server message when the cue sheet fails, and download nothing', async () => {
    api.use(
      http.get(apiPath('/channels/1/outlines/31/cue-sheet.pdf'), () =>
        HttpResponse.json({ code: 'forbidden', message: 'Your role in this channel (viewer) does not allow this' }, { status: 403 }),
      ),
    )
    const { exports } = setup()
    await exports.exportAs('cue-sheet')
    expect(exports.error.value).toBe('Your role in this channel (viewer) does not allow this')
    expect(exports.busy.value).toBe(false)
    expect(downloads).toEqual([])
  })

  it('should download the grid picture the server draws, named after the puzzle, take, step and shape', async () => {
    const asked: string[] = []
    // the eight bytes every PNG file opens with (PNG specification, section 5.2)
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])
    api.use(
      http.get(apiPath('/channels/1/outlines/31/picture.png'), ({ request }) => {
        asked.push(new URL(request.url).search)
        return new HttpResponse(new Blob([png], { type: 'image/png' }), { headers: { 'Content-Type': 'image/png' } })
      }),
    )
    const { exports, saveFirst } = setup()
    await exports.downloadPicture({ step: 7, shape: 'square', highlights: 'off' })
    expect(asked).toEqual(['?step=7&shape=square&highlights=off'])
    expect(saveFirst).not.toHaveBeenCalled()
    expect(downloads[0]!.name).toBe('project-euler-96-grid-01-first-take-grid-step-7-square-plain.png')
    expect(new Uint8Array(await downloads[0]!.blob.arrayBuffer())).toEqual(png)
  })

  it('should show the server message when the step is out of range, and download nothing', async () => {
    api.use(
      http.get(apiPath('/channels/1/outlines/31/picture.png'), () =>
        HttpResponse.json({ code: 'step-out-of-range', message: 'This take has 57 steps; pick a step from 0 to 57' }, { status: 400 }),
      ),
    )
    const { exports } = setup()
    await exports.downloadPicture({ step: 58, shape: 'wide', highlights: 'on' })
    expect(exports.error.value).toBe('This take has 57 steps; pick a step from 0 to 57')
    expect(downloads).toEqual([])
  })
})
