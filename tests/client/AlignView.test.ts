import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Role } from '@shared/schemas/auth'
import type { AlignmentRun } from '@shared/schemas/recording'
import type { Outline } from '@shared/script'
import type { OutlineRecord } from '@shared/schemas/studio'
import App from '@/App.vue'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt, settle } from './render'
import { membership, recordingFixture, saveSession, sessionFixture } from './support'

const TAKE = '/channels/12/outlines/31'
const ALIGN = `${TAKE}/align`

const recording = recordingFixture

function run(overrides: Partial<AlignmentRun> = {}): AlignmentRun {
  return {
    id: 70,
    recordingId: 5,
    method: 'audio',
    state: 'queued',
    progress: 0,
    proposals: [],
    unplaced: [],
    error: null,
    createdAt: '2026-11-30T09:05:00.000Z',
    ...overrides,
  }
}

/** What the screen's server calls answered; saves are recorded in `saved`. */
interface Served {
  saved: Outline['lines'][]
  /** the trim each save carried */
  trims: Outline['trim'][]
  /** how many playback links the screen asked for */
  links: number
}

/** Signs in as a member of channel 12 and answers the take, its recordings, the file and its waveform. */
function serve(doc: Outline, { role = 'editor' as Role, recordings = [recording()], runs = [] as AlignmentRun[] } = {}): Served {
  const served: Served = { saved: [], trims: [], links: 0 }
  const record: OutlineRecord = recordFor(doc)
  let version = record.version
  saveSession()
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, role)] })),
    http.get(apiPath('/channels/12/outlines/31'), () => HttpResponse.json(record)),
    http.patch(apiPath('/channels/12/outlines/31'), async ({ request }) => {
      const body = (await request.json()) as { version: number; script: { lines: Outline['lines']; trim?: Outline['trim'] } }
      served.saved.push(body.script.lines)
      served.trims.push(body.script.trim)
      version += 1
      return HttpResponse.json({ ...record, outline: undefined, version })
    }),
    http.get(apiPath('/channels/12/outlines/31/recordings'), () => HttpResponse.json(recordings)),
    // a link good for an hour, numbered so a renewed one is told apart
    http.get(apiPath('/channels/12/outlines/31/recordings/5/media-link'), () => {
      served.links += 1
      return HttpResponse.json({ url: `/api/media/link-${served.links}`, expiresAt: new Date(Date.now() + 3600_000).toISOString() })
    }),
    http.get(apiPath('/channels/12/outlines/31/recordings/5/peaks'), () => HttpResponse.json({ durationMs: 60_000, perSecond: 10, peaks: Array.from({ length: 600 }, (_, i) => (i % 10) / 10) })),
    http.get(apiPath('/channels/12/outlines/31/recordings/5/alignments'), () => HttpResponse.json(runs)),
  )
  return served
}

async function openAlign() {
  const rendered = await renderAt(App, ALIGN)
  await screen.findByRole('heading', { name: /^Align ·/ })
  await vi.waitFor(() => expect(document.querySelector('audio')).not.toBeNull())
  return rendered
}

const media = () => document.querySelector('audio')!
/** Moves the recording to `seconds`, as playing would. */
function playTo(seconds: number): void {
  media().currentTime = seconds
  media().dispatchEvent(new Event('timeupdate'))
}
const lineButton = (number: number) => screen.getByRole('button', { name: new RegExp(`^Line ${number}, `) })
const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

describe('AlignView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ shouldAdvanceTime: true })
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('should stamp three lines with the S key as the recording plays, and save their starts through the autosave', async () => {
    const doc = outlineFor('PE01')
    const served = serve(doc)
    await openAlign()
    expect(lineButton(1)).toHaveAccessibleName(/^Line 1, no time yet/)
    expect(lineButton(1)).toHaveAttribute('aria-current', 'true')

    playTo(1.0)
    await user().keyboard('s')
    playTo(4.2)
    await user().keyboard('s')
    playTo(7.5)
    await user().keyboard('s')

    expect(lineButton(1)).toHaveAccessibleName(/^Line 1, starts at 0:01\.0$/)
    expect(lineButton(2)).toHaveAccessibleName(/^Line 2, starts at 0:04\.2$/)
    expect(lineButton(3)).toHaveAccessibleName(/^Line 3, starts at 0:07\.5$/)
    // each stamp chooses the next line, ready for the next one
    expect(lineButton(4)).toHaveAttribute('aria-current', 'true')
    expect(screen.getByText('Line 3 starts at 0:07.5.')).toBeInTheDocument()

    await vi.advanceTimersByTimeAsync(1100)
    await settle()
    const saved = served.saved[served.saved.length - 1]
    expect(saved.slice(0, 4).map((l) => l.alignedStartMs)).toEqual([1000, 4200, 7500, undefined])
  })

  it('should play from a signed link (no download), and take a new link before it runs out without losing the place', async () => {
    serve(outlineFor('PE01'))
    await openAlign()
    expect(media().getAttribute('src')).toBe('/api/media/link-1')
    playTo(12)

    // the link runs for an hour: a new one comes half an hour before it ends
    await vi.advanceTimersByTimeAsync(29 * 60_000)
    expect(media().getAttribute('src')).toBe('/api/media/link-1')
    await vi.advanceTimersByTimeAsync(2 * 60_000)
    await vi.waitFor(() => expect(media().getAttribute('src')).toBe('/api/media/link-2'))
    // a browser reloads the element for its new source: it starts at 0 until its metadata is in
    media().currentTime = 0
    media().dispatchEvent(new Event('loadedmetadata'))
    expect(media().currentTime).toBe(12)
  })

  it('should say a recording is being converted, ask no link for it meanwhile, and play it once it is ready', async () => {
    const served = serve(outlineFor('PE01'), { recordings: [recording({ playback: 'preparing', hasPeaks: false })] })
    await renderAt(App, ALIGN)
    expect(await screen.findByText(/take-one\.webm is being converted into a file browsers can play/)).toBeInTheDocument()
    expect(document.querySelector('audio')).toBeNull()
    expect(served.links).toBe(0)

    // the list is asked again while the conversion runs
    api.use(http.get(apiPath('/channels/12/outlines/31/recordings'), () => HttpResponse.json([recording()])))
    await vi.advanceTimersByTimeAsync(3500)
    await vi.waitFor(() => expect(media().getAttribute('src')).toBe('/api/media/link-1'))
    expect(screen.queryByText(/is being converted/)).toBeNull()
  })

  it('should say why a recording could not be made playable', async () => {
    const note = "Browsers can't play this file as it was uploaded, and converting it failed: ffmpeg stopped."
    const served = serve(outlineFor('PE01'), { recordings: [recording({ playback: 'failed', playbackNote: note, hasPeaks: false })] })
    await renderAt(App, ALIGN)
    expect(await screen.findByText(note)).toBeInTheDocument()
    expect(served.links).toBe(0)
  })

  it('should cut the video at the playing position with keys and buttons, save the cut and undo it', async () => {
    const doc = outlineFor('PE01')
    doc.lines[0].alignedStartMs = 4200
    const served = serve(doc)
    await openAlign()
    const summary = () => screen.getByText(/^The video (is|runs)/)
    expect(summary()).toHaveTextContent('The video is the whole recording.')
    expect(screen.getByText('the video starts here (cut the recording before this point)')).toBeInTheDocument()

    playTo(3)
    await user().keyboard('v')
    expect(summary()).toHaveTextContent('The video runs from 0:03.0 to the end of the recording.')
    playTo(50)
    await user().click(screen.getByRole('button', { name: 'Video ends here' }))
    expect(summary()).toHaveTextContent('The video runs from 0:03.0 to 0:50.0.')
    // this screen stays in recording time: line 1 still reads where it is said in the recording
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:04\.2$/)

    await vi.advanceTimersByTimeAsync(1100)
    await settle()
    expect(served.trims[served.trims.length - 1]).toEqual({ inMs: 3000, outMs: 50_000 })

    // a cut-in after the cut-out is refused with the reason
    playTo(55)
    await user().keyboard('v')
    expect(screen.getByText(/the video must end after it starts/)).toBeInTheDocument()
    expect(summary()).toHaveTextContent('The video runs from 0:03.0 to 0:50.0.')

    await user().keyboard('{Control>}z{/Control}')
    expect(summary()).toHaveTextContent('The video runs from 0:03.0 to the end of the recording.')
    await user().click(screen.getByRole('button', { name: 'Use the whole recording' }))
    expect(summary()).toHaveTextContent('The video is the whole recording.')
    await vi.advanceTimersByTimeAsync(1100)
    await settle()
    expect(served.trims[served.trims.length - 1]).toBeUndefined()
  })

  it('should move the grid with the recording and seek to a line when it is clicked', async () => {
    const doc = outlineFor('PE01')
    const lines = doc.lines.slice(0, 3)
    lines.forEach((l, i) => (l.alignedStartMs = [0, 5000, 9000][i]))
    serve(doc)
    await openAlign()
    expect(screen.getByRole('grid', { name: 'Grid while line 1 is said' })).toBeInTheDocument()

    playTo(6)
    // the line whose start is the last at or before the position: line 2 (5 s), not line 3 (9 s)
    expect(await screen.findByRole('grid', { name: 'Grid while line 2 is said' })).toBeInTheDocument()

    await user().click(lineButton(3))
    expect(media().currentTime).toBe(9)
    expect(lineButton(3)).toHaveAttribute('aria-current', 'true')
    media().dispatchEvent(new Event('seeked'))
    expect(await screen.findByRole('grid', { name: 'Grid while line 3 is said' })).toBeInTheDocument()
  })

  it('should nudge the chosen line by a tenth of a second with keys and buttons, and undo each step', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    await openAlign()
    playTo(2)
    await user().keyboard('s')
    expect(lineButton(2)).toHaveAttribute('aria-current', 'true')

    await user().keyboard('{ArrowUp}')
    expect(lineButton(1)).toHaveAttribute('aria-current', 'true')
    await user().keyboard('++')
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.2$/)
    await user().click(screen.getByRole('button', { name: '0.1 s earlier' }))
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.1$/)
    await user().keyboard('-')
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.0$/)

    await user().keyboard('{Control>}z{/Control}')
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.1$/)
    await user().click(screen.getByRole('button', { name: 'Undo' }))
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.2$/)
    await user().keyboard('{Control>}z{/Control}{Control>}z{/Control}')
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:02\.0$/)
    // the stamp itself is undone last: the line is back to an estimate
    await user().keyboard('{Control>}z{/Control}')
    expect(lineButton(1)).toHaveAccessibleName(/^Line 1, no time yet/)
    expect(screen.getByRole('button', { name: 'Undo' })).toBeDisabled()
  })

  it('should refuse to nudge a line past its neighbour and say why', async () => {
    const doc = outlineFor('PE01')
    doc.lines[0].alignedStartMs = 1000
    doc.lines[1].alignedStartMs = 1050
    serve(doc)
    await openAlign()
    await user().click(lineButton(1))

    await user().keyboard('+')

    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:01\.0$/)
    expect(screen.getByText(/can't start after line/)).toBeInTheDocument()
  })

  it('should show a run’s progress while it works, and let it be cancelled', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    let current = run({ state: 'running', progress: 0.4 })
    const cancelled: number[] = []
    api.use(
      http.post(apiPath('/channels/12/outlines/31/recordings/5/alignments'), async ({ request }) => {
        expect(await request.json()).toEqual({ method: 'audio' })
        return HttpResponse.json(run(), { status: 202 })
      }),
      http.get(apiPath('/channels/12/outlines/31/recordings/5/alignments/70'), () => HttpResponse.json(current)),
      http.delete(apiPath('/channels/12/outlines/31/recordings/5/alignments/70'), () => {
        cancelled.push(70)
        current = run({ state: 'cancelled', progress: 0.4 })
        return HttpResponse.json(current)
      }),
    )
    await openAlign()

    await user().click(screen.getByRole('button', { name: 'From the audio' }))
    expect(await screen.findByText('Listening to the recording: waiting to start…')).toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(1000)
    expect(await screen.findByText('Listening to the recording… 40%')).toBeInTheDocument()
    expect(screen.getByRole('progressbar', { name: 'Suggestion progress' })).toHaveAttribute('aria-valuenow', '40')
    expect(screen.getByRole('button', { name: 'From the audio' })).toBeDisabled()

    await user().click(screen.getByRole('button', { name: 'Cancel suggestions' }))
    expect(await screen.findByText('The last suggestions were cancelled.')).toBeInTheDocument()
    expect(cancelled).toEqual([70])
  })

  it('should list proposals with confidence, accept, adjust and reject them one by one, and accept the rest above a threshold', async () => {
    const doc = outlineFor('PE01')
    const ids = doc.lines.map((l) => l.id)
    const finished = run({
      state: 'done',
      progress: 1,
      proposals: [
        { lineId: ids[0], startMs: 500, confidence: 0.97 },
        { lineId: ids[1], startMs: 4000, confidence: 0.91 },
        { lineId: ids[2], startMs: 8000, confidence: 0.55 },
        { lineId: ids[3], startMs: 12000, confidence: 0.88 },
        { lineId: ids[5], startMs: 20000, confidence: 0.62 },
      ],
      unplaced: [ids[4]],
    })
    const served = serve(doc, { runs: [finished] })
    api.use(http.get(apiPath('/channels/12/outlines/31/recordings/5/alignments/70'), () => HttpResponse.json(finished)))
    await openAlign()
    const suggestions = () => screen.getByRole('list', { name: 'Suggestions by line' })
    await vi.waitFor(() => expect(suggestions()).toBeInTheDocument())
    expect(within(suggestions()).getAllByRole('listitem')).toHaveLength(5)
    expect(within(suggestions()).getByText('Line 2 · 0:04.0 · 91%')).toBeInTheDocument()
    // the count first; the lines themselves in a list that opens on request
    const unplaced = screen.getByText("Gridcue couldn't place 1 line: stamp it by ear.")
    expect(screen.getByText(/^Line 5: “/)).not.toBeVisible()
    await user().click(unplaced)
    expect(screen.getByText(/^Line 5: “/)).toBeVisible()

    await user().click(screen.getByRole('button', { name: 'Accept line 1 at 0:00.5' }))
    expect(lineButton(1)).toHaveAccessibleName(/starts at 0:00\.5$/)
    await user().click(screen.getByRole('button', { name: 'Reject line 2' }))
    expect(within(suggestions()).getAllByRole('listitem')[1]).toHaveTextContent('Turned down')
    // adjust, then accept: 8.0 s nudged later twice
    await user().click(screen.getByRole('button', { name: 'Line 3 suggestion 0.1 s later' }))
    await user().click(screen.getByRole('button', { name: 'Line 3 suggestion 0.1 s later' }))
    await user().click(screen.getByRole('button', { name: 'Accept line 3 at 0:08.2' }))
    expect(lineButton(3)).toHaveAccessibleName(/starts at 0:08\.2$/)

    // at 80% or more, only line 4 (88%) is still open: line 2 was turned down, line 6 is below
    await user().click(screen.getByRole('button', { name: 'Accept all at 80% or more' }))
    expect(lineButton(4)).toHaveAccessibleName(/starts at 0:12\.0$/)
    expect(lineButton(2)).toHaveAccessibleName(/no time yet/)
    expect(lineButton(6)).toHaveAccessibleName(/no time yet/)

    // accepting is an ordinary edit: undo takes the last acceptance back and opens its proposal again
    await user().keyboard('{Control>}z{/Control}')
    expect(lineButton(4)).toHaveAccessibleName(/no time yet/)
    expect(screen.getByRole('button', { name: 'Accept line 4 at 0:12.0' })).toBeInTheDocument()

    await vi.advanceTimersByTimeAsync(1100)
    await settle()
    const saved = served.saved[served.saved.length - 1]
    expect(saved.slice(0, 4).map((l) => l.alignedStartMs)).toEqual([500, undefined, 8200, undefined])
  })

  it('should send a caption file for suggestions as the multipart field `file` with method `captions`', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    const sent: { method: unknown; name: string | undefined }[] = []
    const finished = run({ id: 71, method: 'captions', state: 'done', progress: 1, proposals: [{ lineId: doc.lines[0].id, startMs: 300, confidence: 0.8 }] })
    api.use(
      http.post(apiPath('/channels/12/outlines/31/recordings/5/alignments'), async ({ request }) => {
        const form = await request.formData()
        sent.push({ method: form.get('method'), name: (form.get('file') as File | null)?.name })
        return HttpResponse.json(finished, { status: 202 })
      }),
      http.get(apiPath('/channels/12/outlines/31/recordings/5/alignments/71'), () => HttpResponse.json(finished)),
    )
    await openAlign()

    // WebVTT's file signature is "WEBVTT" (W3C WebVTT §4.1)
    const captions = new File(['WEBVTT\n\n00:00.300 --> 00:02.000\nhello there\n'], 'take-one.vtt', { type: 'text/vtt' })
    await user().upload(screen.getByLabelText('Caption file (WebVTT or SRT)'), captions)

    expect(await screen.findByRole('button', { name: 'Accept line 1 at 0:00.3' })).toBeInTheDocument()
    expect(sent).toEqual([{ method: 'captions', name: 'take-one.vtt' }])
  })

  it('should say why a run failed', async () => {
    const doc = outlineFor('PE01')
    const failed = run({ state: 'failed', error: 'The recording has no sound in it.' })
    serve(doc, { runs: [failed] })
    api.use(http.get(apiPath('/channels/12/outlines/31/recordings/5/alignments/70'), () => HttpResponse.json(failed)))
    await openAlign()

    expect(await screen.findByText('The suggestions failed. The recording has no sound in it.')).toBeInTheDocument()
  })

  it('should give a viewer neither the Studio nor the way in to Align', async () => {
    const doc = outlineFor('PE01')
    serve(doc, { role: 'viewer' })
    // where the guard sends them: the home page lists their channels
    api.use(http.get(apiPath('/channels'), () => HttpResponse.json([])))

    const { router } = await renderAt(App, ALIGN)

    expect(router.currentRoute.value.name).toBe('home')
    expect(router.currentRoute.value.query.notice).toBe('forbidden')
    expect(screen.queryByRole('link', { name: 'Align to the recording' })).not.toBeInTheDocument()
  })

  it.each([
    ['editor', true],
    ['owner', true],
    ['presenter', false],
  ] as const)('should show the way in from the Studio to a member with the role %s: %s', async (role, shown) => {
    const doc = outlineFor('PE01')
    serve(doc, { role })
    const { router } = await renderAt(App, TAKE)
    await screen.findByRole('region', { name: 'Replay' })

    const link = screen.queryByRole('link', { name: 'Align to the recording' })
    if (!shown) {
      expect(link).not.toBeInTheDocument()
      return
    }
    await user().click(link!)
    await screen.findByRole('heading', { name: /^Align ·/ })
    expect(router.currentRoute.value.name).toBe('align')
  })
})
