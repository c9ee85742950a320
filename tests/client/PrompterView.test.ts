import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { fireEvent, screen } from '@testing-library/vue'
import type { Role } from '@shared/schemas/auth'
import type { RehearsalCreate, RehearsalList } from '@shared/schemas/rehearsal'
import type { Outline } from '@shared/script'
import PrompterView from '@/views/PrompterView.vue'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt, settle } from './render'
import { membership, recordingFixture, saveSession, sessionFixture } from './support'

const PROMPTER = '/channels/12/outlines/31/prompter'

/** Signs in as a member of channel 12 and answers the take and its runs; saved runs land in the array returned. */
function serve(doc: Outline, { role = 'presenter' as Role, list = { runs: [], calibration: null } as RehearsalList } = {}): RehearsalCreate[] {
  const saved: RehearsalCreate[] = []
  saveSession()
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, role)] })),
    http.get(apiPath('/channels/12/outlines/31'), () => HttpResponse.json(recordFor(doc))),
    http.get(apiPath('/channels/12/outlines/31/rehearsals'), () => HttpResponse.json(list)),
    http.post(apiPath('/channels/12/outlines/31/rehearsals'), async ({ request }) => {
      const body = (await request.json()) as RehearsalCreate
      saved.push(body)
      const lines = body.lines.map((l) => ({ ...l, isBreak: l.ms > 60_000, work: { words: 1, placements: 0, marks: 0, whatIfMoves: 0 } }))
      return HttpResponse.json(
        { id: 1, outlineId: 31, name: body.name, presenterId: 7, presenterName: 'Ada Lane', lines, speechMs: 0, createdAt: '2026-12-02T10:00:00.000Z' },
        { status: 201 },
      )
    }),
  )
  return saved
}

const current = () => screen.getByTestId('prompter-current')
const press = (key: string) => fireEvent.keyDown(window, { key })

describe('PrompterView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ now: new Date('2026-12-02T09:00:00Z') })
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('times each line from advance to advance with the pedal keys, and saves the run with a name', async () => {
    const doc = outlineFor('PE01')
    const saved = serve(doc)
    await renderAt(PrompterView, PROMPTER, { props: { channelId: 12, outlineId: 31 } })
    expect(current()).toHaveTextContent(doc.lines[0].text)
    expect(screen.getByText(/Press Space, Page Down or an arrow/)).toBeInTheDocument()

    // Space starts the run on the first line; Page Down, → and ↓ move on (what foot pedals send: common practice)
    await press(' ')
    await vi.advanceTimersByTimeAsync(4000)
    await press('PageDown')
    await settle()
    expect(current()).toHaveTextContent(doc.lines[1].text)
    await vi.advanceTimersByTimeAsync(3000)
    await press('ArrowLeft') // back to the first line: its time goes on growing
    await settle()
    expect(current()).toHaveTextContent(doc.lines[0].text)
    await vi.advanceTimersByTimeAsync(1000)
    await press('ArrowRight')
    await vi.advanceTimersByTimeAsync(2000)
    await press('ArrowDown')
    await settle()
    expect(current()).toHaveTextContent(doc.lines[2].text)
    await vi.advanceTimersByTimeAsync(5000)
    await press('e')
    await settle()

    expect(screen.getByRole('heading', { name: 'Run finished' })).toBeInTheDocument()
    const name = screen.getByLabelText('Name of the run')
    expect(name).toHaveValue('Run 1')
    await fireEvent.update(name, 'Morning run')
    await fireEvent.click(screen.getByRole('button', { name: 'Save the run' }))
    await settle()
    expect(saved).toEqual([
      {
        name: 'Morning run',
        lines: [
          { lineId: doc.lines[0].id, ms: 5000 },
          { lineId: doc.lines[1].id, ms: 5000 },
          { lineId: doc.lines[2].id, ms: 5000 },
        ],
      },
    ])
    expect(screen.getByRole('status')).toHaveTextContent('Saved “Morning run”')
    expect(current()).toHaveTextContent(doc.lines[0].text)
  })

  it('advances by itself at each line’s estimated time when timed advance is on', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    await renderAt(PrompterView, PROMPTER, { props: { channelId: 12, outlineId: 31 } })
    await press('t')
    await settle()
    expect(screen.getByRole('checkbox', { name: 'Timed advance' })).toBeChecked()
    await press(' ')
    await vi.advanceTimersByTimeAsync(doc.lines[0].estMs - 1)
    expect(current()).toHaveTextContent(doc.lines[0].text)
    await vi.advanceTimersByTimeAsync(1)
    expect(current()).toHaveTextContent(doc.lines[1].text)
    await vi.advanceTimersByTimeAsync(doc.lines[1].estMs)
    expect(current()).toHaveTextContent(doc.lines[2].text)
  })

  it('discards a finished run without saving anything, and mirrors and resizes from its own keys', async () => {
    const doc = outlineFor('PE01')
    const saved = serve(doc)
    await renderAt(PrompterView, PROMPTER, { props: { channelId: 12, outlineId: 31 } })
    await press('m')
    await press('+')
    await settle()
    expect(screen.getByRole('checkbox', { name: 'Mirror' })).toBeChecked()
    expect(screen.getByLabelText('Prompter')).toHaveClass('stage--mirrored')
    expect(current().style.fontSize).toBe('3rem')

    await press(' ')
    await vi.advanceTimersByTimeAsync(70_000)
    await press('e')
    await settle()
    // a line over a minute is a break, not speech
    expect(screen.getByText(/1 break/)).toBeInTheDocument()
    await fireEvent.click(screen.getByRole('button', { name: 'Discard it' }))
    await settle()
    expect(saved).toEqual([])
    expect(current()).toHaveTextContent(doc.lines[0].text)
  })

  it('lists its keys on screen', async () => {
    serve(outlineFor('PE01'))
    await renderAt(PrompterView, PROMPTER, { props: { channelId: 12, outlineId: 31 } })
    expect(screen.getByText('Space · Page Down · → · ↓')).toBeInTheDocument()
    expect(screen.getByText('mirror for glass')).toBeInTheDocument()
  })
})

/** A stand-in microphone recorder: what MediaRecorder does, minus the audio (jsdom has none). */
class FakeRecorder extends EventTarget {
  state: 'inactive' | 'recording' = 'inactive'
  readonly mimeType = 'audio/webm'
  constructor(readonly stream: { getTracks: () => { stop: () => void }[] }) {
    super()
  }
  start(): void {
    this.state = 'recording'
  }
  stop(): void {
    this.state = 'inactive'
    this.dispatchEvent(Object.assign(new Event('dataavailable'), { data: new Blob(['voice'], { type: 'audio/webm' }) }))
    this.dispatchEvent(new Event('stop'))
  }
}

describe('PrompterView, recording while rehearsing', { timeout: 20_000 }, () => {
  const trackStops = vi.fn()
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ now: new Date('2026-12-02T09:00:00Z'), shouldAdvanceTime: false })
    vi.stubGlobal('MediaRecorder', FakeRecorder)
    Object.defineProperty(navigator, 'mediaDevices', {
      configurable: true,
      value: { getUserMedia: vi.fn(async () => ({ getTracks: () => [{ stop: trackStops }] })) },
    })
    vi.spyOn(URL, 'createObjectURL').mockReturnValue('blob:run')
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {})
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
    vi.restoreAllMocks()
    Reflect.deleteProperty(navigator, 'mediaDevices')
  })

  it("sends the run's recording to the take, current, with each line's start from the advances", async () => {
    const doc = outlineFor('PE01')
    serve(doc, { role: 'owner' })
    const sent: { uploads: number; current: unknown[]; lines: Outline['lines'][] } = { uploads: 0, current: [], lines: [] }
    api.use(
      http.post(apiPath('/channels/12/outlines/31/recordings'), () => {
        sent.uploads += 1
        return HttpResponse.json(recordingFixture({ id: 9, current: false }), { status: 201 })
      }),
      http.patch(apiPath('/channels/12/outlines/31/recordings/9'), async ({ request }) => {
        sent.current.push(await request.json())
        return HttpResponse.json(recordingFixture({ id: 9, current: true }))
      }),
      http.patch(apiPath('/channels/12/outlines/31'), async ({ request }) => {
        const body = (await request.json()) as { script: { lines: Outline['lines'] } }
        sent.lines.push(body.script.lines)
        const { outline: _whole, ...summary } = recordFor(doc)
        return HttpResponse.json({ ...summary, version: 4 })
      }),
    )
    await renderAt(PrompterView, PROMPTER, { props: { channelId: 12, outlineId: 31 } })
    await fireEvent.click(screen.getByRole('checkbox', { name: 'Record my voice during the run' }))
    await press(' ')
    await settle()
    expect(screen.getByText('● Recording')).toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(4000)
    await press(' ')
    await vi.advanceTimersByTimeAsync(3000)
    await press(' ')
    await vi.advanceTimersByTimeAsync(2000)
    await press('e')
    await settle()
    expect(screen.getByLabelText('Recording of this run')).toBeInTheDocument()
    expect(trackStops).toHaveBeenCalled()
    await fireEvent.click(screen.getByRole('button', { name: 'Save the run' }))
    await vi.waitFor(() => expect(sent.lines).toHaveLength(1))
    expect(sent.uploads).toBe(1)
    expect(sent.current).toEqual([{ current: true }])
    // the advances, from the recording's start, are the take's aligned line starts
    expect(sent.lines[0].slice(0, 4).map((l) => l.alignedStartMs)).toEqual([0, 4000, 7000, undefined])
    await vi.waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('and its recording, with the line starts'))
  })
})
