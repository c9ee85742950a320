import { z } from 'zod'
import { alignmentRunSchema, mediaLinkSchema, peaksSchema, recordingSchema } from '@shared/schemas/recording'
import type { AlignmentRun, MediaLink, Peaks, Recording, RecordingUpdate } from '@shared/schemas/recording'
import { config } from '@/config'
import { ApiError, http, httpAuth, noContent, toApiError } from './http'
import type { Parser } from './http'

const recordingListSchema = z.array(recordingSchema)
const alignmentRunListSchema = z.array(alignmentRunSchema)

const takeBase = (channelId: number, outlineId: number) => `/channels/${channelId}/outlines/${outlineId}/recordings`
const recordingBase = (channelId: number, outlineId: number, recordingId: number) => `${takeBase(channelId, outlineId)}/${recordingId}`

/** How far an upload has gone, in bytes of the request body. */
export interface UploadProgress {
  loaded: number
  total: number
}

interface UploadOptions {
  onProgress?: (progress: UploadProgress) => void
  /** Aborting stops the upload; the promise rejects with an AbortError and the server keeps nothing. */
  signal?: AbortSignal
}

/** The take's recordings, newest first. */
export function listRecordings(channelId: number, outlineId: number, signal?: AbortSignal): Promise<Recording[]> {
  return http.get(takeBase(channelId, outlineId), recordingListSchema, { signal })
}

/** Sends a video or audio file, reporting progress as it goes; the server answers 415 or 413 with a sentence for people. */
export function uploadRecording(channelId: number, outlineId: number, file: File, options: UploadOptions = {}): Promise<Recording> {
  const form = new FormData()
  form.append('file', file)
  return sendForm(takeBase(channelId, outlineId), form, recordingSchema, options)
}

/** Renames a recording or makes it the take's current one. */
export function updateRecording(channelId: number, outlineId: number, recordingId: number, body: RecordingUpdate): Promise<Recording> {
  return http.patch(recordingBase(channelId, outlineId, recordingId), body, recordingSchema)
}

/** Deletes the recording and its file. */
export function removeRecording(channelId: number, outlineId: number, recordingId: number): Promise<void> {
  return http.delete(recordingBase(channelId, outlineId, recordingId), noContent)
}

/** A short-lived address a media element plays the recording from, in ranges, without the session's token. */
export function getMediaLink(channelId: number, outlineId: number, recordingId: number, signal?: AbortSignal): Promise<MediaLink> {
  return http.get(`${recordingBase(channelId, outlineId, recordingId)}/media-link`, mediaLinkSchema, { signal })
}

/** The waveform the server computed once, so the browser never decodes the file. */
export function getPeaks(channelId: number, outlineId: number, recordingId: number, signal?: AbortSignal): Promise<Peaks> {
  return http.get(`${recordingBase(channelId, outlineId, recordingId)}/peaks`, peaksSchema, { signal })
}

/** Starts listening to the recording itself for where each line is said: a background run. */
export function startAudioAlignment(channelId: number, outlineId: number, recordingId: number): Promise<AlignmentRun> {
  return http.post(`${recordingBase(channelId, outlineId, recordingId)}/alignments`, { method: 'audio' }, alignmentRunSchema)
}

/** Starts matching the lines to a caption file (WebVTT or SRT) made from the recording. */
export function startCaptionAlignment(channelId: number, outlineId: number, recordingId: number, captions: File): Promise<AlignmentRun> {
  const form = new FormData()
  form.append('method', 'captions')
  form.append('file', captions)
  return sendForm(`${recordingBase(channelId, outlineId, recordingId)}/alignments`, form, alignmentRunSchema)
}

export function getAlignmentRun(channelId: number, outlineId: number, recordingId: number, runId: number, signal?: AbortSignal): Promise<AlignmentRun> {
  return http.get(`${recordingBase(channelId, outlineId, recordingId)}/alignments/${runId}`, alignmentRunSchema, { signal })
}

/** The recording's alignment runs, newest first. */
export function listAlignmentRuns(channelId: number, outlineId: number, recordingId: number, signal?: AbortSignal): Promise<AlignmentRun[]> {
  return http.get(`${recordingBase(channelId, outlineId, recordingId)}/alignments`, alignmentRunListSchema, { signal })
}

/** Stops a run that is still queued or running; answers the run as it now stands. */
export function cancelAlignmentRun(channelId: number, outlineId: number, recordingId: number, runId: number): Promise<AlignmentRun> {
  return http.delete(`${recordingBase(channelId, outlineId, recordingId)}/alignments/${runId}`, alignmentRunSchema)
}

/**
 * POSTs a multipart form with XMLHttpRequest: fetch can't report how much of a request body has gone, and a
 * recording can take minutes to send. Token, 401 handling and error bodies are treated as the HTTP client does.
 */
function sendForm<T>(path: string, form: FormData, parser: Parser<T>, { onProgress, signal }: UploadOptions = {}): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    if (signal?.aborted) return reject(abortError())
    const xhr = new XMLHttpRequest()
    const auth = httpAuth()
    const token = auth.getToken()
    xhr.open('POST', `${config.apiBase}${path}`)
    xhr.setRequestHeader('Accept', 'application/json')
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`)

    // settled here, not on the request's own abort event: a request that never reached the network may not fire one
    const abort = () => {
      xhr.abort()
      reject(abortError())
    }
    signal?.addEventListener('abort', abort, { once: true })
    const done = () => signal?.removeEventListener('abort', abort)

    xhr.upload.addEventListener('progress', (event) => {
      if (event.lengthComputable) onProgress?.({ loaded: event.loaded, total: event.total })
    })
    xhr.addEventListener('load', () => {
      done()
      const data = parseJson(xhr.responseText)
      if (xhr.status < 200 || xhr.status >= 300) {
        if (xhr.status === 401 && token) auth.onUnauthorized()
        return reject(toApiError(xhr.status, data))
      }
      try {
        resolve(parser.parse(data))
      } catch {
        reject(new ApiError(xhr.status, 'unexpected-response', 'The server sent an answer Gridcue does not understand.'))
      }
    })
    xhr.addEventListener('error', () => {
      done()
      reject(new ApiError(0, 'network-error', "The upload stopped: Gridcue can't be reached. Check your connection and try again."))
    })
    xhr.send(form)
  })
}

function abortError(): DOMException {
  return new DOMException('The upload was cancelled.', 'AbortError')
}

function parseJson(text: string): unknown {
  if (!text) return undefined
  try {
    return JSON.parse(text)
  } catch {
    return undefined
  }
}

/** True for the rejection of an upload someone cancelled (not a failure to report). */
export function isAbortError(error: unknown): boolean {
  return error instanceof DOMException && error.name === 'AbortError'
}
