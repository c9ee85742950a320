import { randomUUID } from 'node:crypto'
import { recordingUpdateSchema } from '../../shared/schemas/recording'
import type { Config } from '../config'
import type { MediaTokens } from '../auth/media-tokens'
import { addRecording, mediaLinkOf, peaksOf, recordingFileByLink, recordingFileOf, recordingsOf, removeRecording, updateRecording, type RecordingDeps } from '../services/recordings'
import { uploadReceiver } from '../uploads/receiver'
import { Media, type EndpointTable } from './endpoint'

const recordings = '/channels/:channelId/outlines/:outlineId/recordings'
const recording = `${recordings}/:recordingId`

/** A take's recordings: upload, list, rename or mark current, delete, play in ranges, and the waveform. */
export function recordingEndpoints(api: EndpointTable, deps: RecordingDeps & { mediaTokens: MediaTokens }, config: Pick<Config, 'uploads'>): void {
  const upload = uploadReceiver({
    storage: deps.storage,
    field: 'file',
    maxBytes: config.uploads.maxBytes,
    kinds: ['audio', 'video'],
    kindsText: 'an audio or video file',
    // our own name, grouped by channel; the uploaded name is kept in the row for people only
    keyOf: (req, ext) => `recordings/${String(req.params.channelId)}/${randomUUID()}.${ext}`,
  })

  api.add({ method: 'get', path: recordings, access: 'recording.read' }, ({ params }) => recordingsOf(deps, params.channelId, params.outlineId))
  api.add({ method: 'post', path: recordings, access: 'recording.edit', upload, status: 201 }, ({ params, upload: file, user }) =>
    addRecording(deps, params.channelId, params.outlineId, file, user),
  )
  api.add({ method: 'patch', path: recording, access: 'recording.edit', body: recordingUpdateSchema }, ({ params, body }) =>
    updateRecording(deps, params.channelId, params.outlineId, params.recordingId, body),
  )
  api.add({ method: 'delete', path: recording, access: 'recording.edit' }, ({ params }) =>
    removeRecording(deps, params.channelId, params.outlineId, params.recordingId),
  )
  api.add({ method: 'get', path: `${recording}/media`, access: 'recording.read' }, async ({ params }) => {
    const file = await recordingFileOf(deps, params.channelId, params.outlineId, params.recordingId)
    return new Media(file.mime, file.sizeBytes, file.open)
  })
  api.add({ method: 'get', path: `${recording}/media-link`, access: 'recording.read' }, ({ params, user }) =>
    mediaLinkOf(deps, deps.mediaTokens, params.channelId, params.outlineId, params.recordingId, user),
  )
  // the link's token is the caller's access: a media element can't send the session's token
  api.addPublic({ method: 'get', path: '/media/:token' }, async ({ params }) => {
    const file = await recordingFileByLink(deps, deps.mediaTokens, params.token)
    return new Media(file.mime, file.sizeBytes, file.open)
  })
  api.add({ method: 'get', path: `${recording}/peaks`, access: 'recording.read' }, ({ params }) =>
    peaksOf(deps, params.channelId, params.outlineId, params.recordingId),
  )
}
