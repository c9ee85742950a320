import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Recording } from '@shared/schemas/recording'
import App from '@/App.vue'
import { isApiError, setHttpAuth } from '@/api/http'
import { isAbortError, uploadRecording } from '@/api/recordings'
import type { UploadProgress } from '@/api/recordings'
import RecordingUpload from '@/components/RecordingUpload.vue'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt, renderComponent, settle } from './render'
import { membership, saveSession, sessionFixture } from './support'

const UPLOAD = '/channels/12/outlines/31/recordings'

function recording(overrides: Partial<Recording> = {}): Recording {
  return {
    id: 5,
    outlineId: 31,
    name: 'take-one.webm',
    mime: 'audio/webm',
    kind: 'audio',
    sizeBytes: 2_000,
    durationMs: 60_000,
    current: true,
    hasPeaks: false,
    playback: 'ready',
    uploadedBy: 'Ada Lane',
    uploadedAt: '2026-11-30T09:00:00.000Z',
    ...overrides,
  }
}

/** A promise the test settles by hand: the server's answer held back while the upload is "on its way". */
function held<T = void>() {
  let release!: (value: T) => void
  const promise = new Promise<T>((resolve) => (release = resolve))
  return { promise, release }
}

const audioFile = (name = 'take-one.webm', bytes = 2_000) => new File([new Uint8Array(bytes)], name, { type: 'audio/webm' })

describe('uploadRecording', () => {
  beforeEach(() => setHttpAuth({ getToken: () => 'secret-token', onUnauthorized: () => {} }))

  it('should send the file as the multipart field `file` with the bearer token and report progress up to the whole body', async () => {
    const seen: { authorization: string | null; name: string | undefined; size: number | undefined }[] = []
    api.use(
      http.post(apiPath(UPLOAD), async ({ request }) => {
        const form = await request.formData()
        const file = form.get('file') as File | null
        seen.push({ authorization: request.headers.get('Authorization'), name: file?.name, size: file?.size })
        return HttpResponse.json(recording(), { status: 201 })
      }),
    )
    const progress: UploadProgress[] = []

    const answer = await uploadRecording(12, 31, audioFile(), { onProgress: (p) => progress.push(p) })

    expect(answer).toEqual(recording())
    expect(seen).toEqual([{ authorization: 'Bearer secret-token', name: 'take-one.webm', size: 2_000 }])
    const last = progress[progress.length - 1]
    // a multipart body is the file plus its part headers (RFC 7578 §4), so it is larger than the file
    expect(last.loaded).toBe(last.total)
    expect(last.total).toBeGreaterThan(2_000)
  })

  it.each([
    [415, 'unsupported-media', 'This file is not audio or video (it looks like plain text).'],
    [413, 'too-large', 'The file is larger than the limit of 4 GB.'],
  ])('should reject a %i with the server’s own sentence', async (status, code, message) => {
    api.use(http.post(apiPath(UPLOAD), () => HttpResponse.json({ code, message }, { status })))

    const error = await uploadRecording(12, 31, audioFile('notes.webm')).catch((e: unknown) => e)

    expect(isApiError(error)).toBe(true)
    expect(error).toMatchObject({ status, code, message })
  })

  it('should end the session when the server refuses the token', async () => {
    const onUnauthorized = vi.fn()
    setHttpAuth({ getToken: () => 'old-token', onUnauthorized })
    api.use(http.post(apiPath(UPLOAD), () => HttpResponse.json({ code: 'unauthorized', message: 'Sign in again.' }, { status: 401 })))

    await expect(uploadRecording(12, 31, audioFile())).rejects.toMatchObject({ status: 401 })
    expect(onUnauthorized).toHaveBeenCalledOnce()
  })

  it('should stop when its signal aborts, and reject as an abort rather than a failure', async () => {
    const reached = held()
    api.use(
      http.post(apiPath(UPLOAD), async () => {
        reached.release()
        await new Promise(() => {})
        return HttpResponse.json(recording(), { status: 201 })
      }),
    )
    const controller = new AbortController()

    const upload = uploadRecording(12, 31, audioFile(), { signal: controller.signal }).catch((e: unknown) => e)
    await reached.promise
    controller.abort()

    expect(isAbortError(await upload)).toBe(true)
  })
})

describe('RecordingUpload', () => {
  it('should show how far an upload has gone in bytes and per cent, and offer to cancel it', async () => {
    const { emitted } = renderComponent(RecordingUpload, {
      props: { fileName: 'take-one.webm', progress: { loaded: 1_500_000, total: 4_000_000 }, error: null, notice: null },
    })

    expect(screen.getByText('Uploading take-one.webm')).toBeInTheDocument()
    expect(screen.getByText('1.50 MB of 4.00 MB · 37%')).toBeInTheDocument()
    expect(screen.getByRole('progressbar', { name: 'Upload progress' })).toHaveAttribute('aria-valuenow', '37')
    await userEvent.click(screen.getByRole('button', { name: 'Cancel upload' }))
    expect(emitted().cancel).toHaveLength(1)
  })
})

describe('recordings on the Align screen', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ shouldAdvanceTime: true })
  })
  afterEach(() => vi.useRealTimers())

  /** An editor of channel 12 on take 31, whose recordings are `list()` at each ask. */
  function serve(list: () => Recording[]) {
    saveSession()
    api.use(
      http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, 'editor')] })),
      http.get(apiPath('/channels/12/outlines/31'), () => HttpResponse.json(recordFor(outlineFor('PE01')))),
      http.get(apiPath(UPLOAD), () => HttpResponse.json(list())),
      http.get(apiPath(`${UPLOAD}/:id/media`), () => new HttpResponse(new Uint8Array(16), { headers: { 'Content-Type': 'audio/webm' } })),
      http.get(apiPath(`${UPLOAD}/:id/alignments`), () => HttpResponse.json([])),
    )
  }

  async function open() {
    await renderAt(App, '/channels/12/outlines/31/align')
    await screen.findByRole('heading', { name: /^Align ·/ })
  }

  const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

  it('should upload a chosen file, show it on its way with a Cancel, and list it once the server has it', async () => {
    let list: Recording[] = []
    serve(() => list)
    const answer = held()
    api.use(
      http.post(apiPath(UPLOAD), async () => {
        await answer.promise
        list = [recording()]
        return HttpResponse.json(recording(), { status: 201 })
      }),
    )
    await open()
    expect(screen.getByText('No recording yet.')).toBeInTheDocument()

    await user().upload(screen.getByLabelText('Recording file'), audioFile())
    expect(await screen.findByText('Uploading take-one.webm')).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Cancel upload' })).toBeInTheDocument()

    answer.release()
    expect(await screen.findByText('take-one.webm is uploaded.')).toBeInTheDocument()
    expect(await screen.findByRole('listitem', { current: true })).toHaveTextContent('take-one.webm')
    expect(screen.queryByRole('button', { name: 'Cancel upload' })).not.toBeInTheDocument()
  })

  it('should stop an upload on Cancel and say nothing was kept', async () => {
    serve(() => [])
    api.use(http.post(apiPath(UPLOAD), () => new Promise<never>(() => {})))
    await open()

    await user().upload(screen.getByLabelText('Recording file'), audioFile())
    await user().click(await screen.findByRole('button', { name: 'Cancel upload' }))

    expect(await screen.findByText('The upload of take-one.webm was cancelled; nothing was kept.')).toBeInTheDocument()
    expect(screen.queryByText('Uploading take-one.webm')).not.toBeInTheDocument()
    expect(screen.getByText('No recording yet.')).toBeInTheDocument()
  })

  it.each([
    [415, 'This file is not audio or video (it looks like plain text).'],
    [413, 'The file is larger than the limit of 4 GB.'],
  ])('should show a %i refusal in the server’s words', async (status, message) => {
    serve(() => [])
    api.use(http.post(apiPath(UPLOAD), () => HttpResponse.json({ code: `http-${status}`, message }, { status })))
    await open()

    await user().upload(screen.getByLabelText('Recording file'), audioFile('notes.webm'))

    expect(await screen.findByRole('alert')).toHaveTextContent(`notes.webm wasn't uploaded. ${message}`)
  })

  it('should make another recording current, and delete one only after a second click', async () => {
    let list = [recording(), recording({ id: 6, name: 'second-try.mp4', kind: 'video', mime: 'video/mp4', current: false })]
    serve(() => list)
    const patched: unknown[] = []
    const deleted: string[] = []
    api.use(
      http.patch(apiPath(`${UPLOAD}/6`), async ({ request }) => {
        patched.push(await request.json())
        list = list.map((r) => ({ ...r, current: r.id === 6 }))
        return HttpResponse.json(list[1])
      }),
      http.delete(apiPath(`${UPLOAD}/:id`), ({ params }) => {
        deleted.push(String(params.id))
        list = list.filter((r) => String(r.id) !== params.id)
        return new HttpResponse(null, { status: 204 })
      }),
    )
    await open()
    expect(await screen.findByRole('listitem', { current: true })).toHaveTextContent('take-one.webm')

    await user().click(screen.getByRole('button', { name: 'Make second-try.mp4 current' }))
    await vi.waitFor(() => expect(screen.getByRole('listitem', { current: true })).toHaveTextContent('second-try.mp4'))
    expect(patched).toEqual([{ current: true }])

    await user().click(screen.getByRole('button', { name: 'Delete take-one.webm…' }))
    expect(deleted).toEqual([])
    await user().click(screen.getByRole('button', { name: 'Keep it' }))
    await user().click(screen.getByRole('button', { name: 'Delete take-one.webm…' }))
    await user().click(screen.getByRole('button', { name: 'Delete for good' }))
    await settle()
    expect(deleted).toEqual(['5'])
    await vi.waitFor(() => expect(screen.queryByText('take-one.webm')).not.toBeInTheDocument())
  })
})
