import type { Request, Response } from 'express'
import multer, { MulterError } from 'multer'
import { alignmentStartSchema } from '../../shared/schemas/recording'
import type { Db } from '../db/knex'
import { HttpError } from '../errors'
import { sizeText } from '../uploads/size-text'
import type { AlignmentQueue } from '../jobs'
import { alignmentOf, alignmentsOf, cancelAlignment, startAlignment } from '../services/alignments'
import type { EndpointTable } from './endpoint'

const runs = '/channels/:channelId/outlines/:outlineId/recordings/:recordingId/alignments'
const run = `${runs}/:runId`

/** A recording's alignment runs: started, watched and cancelled; the work itself happens in a job. */
export function alignmentEndpoints(api: EndpointTable, db: Db, queue: AlignmentQueue): void {
  api.add({ method: 'post', path: runs, access: 'recording.edit', body: alignmentStartSchema, upload: receiveCaptionFile, status: 202 }, ({ params, body, upload, user }) =>
    startAlignment(db, queue, params, { method: body.method, captionText: upload?.text }, user),
  )
  api.add({ method: 'get', path: runs, access: 'recording.read' }, ({ params }) => alignmentsOf(db, params))
  api.add({ method: 'get', path: run, access: 'recording.read' }, ({ params }) => alignmentOf(db, params, params.runId))
  api.add({ method: 'delete', path: run, access: 'recording.edit' }, ({ params }) => cancelAlignment(db, queue, params, params.runId))
}

// Captions made by video platforms for an hour of speech come to a few hundred KB.
const CAPTION_MAX_BYTES = 2 * 1024 * 1024
const CAPTION_FIELD = 'file'

interface CaptionFile {
  text: string
  /** held in memory only: nothing to remove */
  discard: () => Promise<void>
}

// a small file is read whole into memory; the form's other field is the method
const receiveCaptions = multer({
  storage: multer.memoryStorage(),
  limits: { files: 1, fields: 5, fieldSize: 1024, parts: 6, fileSize: CAPTION_MAX_BYTES },
}).single(CAPTION_FIELD)

const utf8 = new TextDecoder('utf-8', { fatal: true })

/** A multipart request's caption file as text (a leading byte-order mark dropped); undefined for a JSON request. */
function receiveCaptionFile(req: Request, res: Response): Promise<CaptionFile | undefined> {
  return new Promise((resolve, reject) => {
    receiveCaptions(req, res, (error?: unknown) => {
      if (error) return reject(captionRefusal(error))
      if (!req.file) return resolve(undefined)
      try {
        resolve({ text: utf8.decode(req.file.buffer), discard: async () => {} })
      } catch {
        reject(new HttpError(400, 'not-captions', 'The caption file is not UTF-8 text, so it is not a WebVTT or SRT file.'))
      }
    })
  })
}

function captionRefusal(error: unknown): unknown {
  if (error instanceof Error && /^Request (aborted|closed|error)$|Unexpected end of form|Malformed part header/.test(error.message)) {
    return new HttpError(400, 'upload-interrupted', 'The caption file stopped before all of it arrived; please send it again.')
  }
  if (!(error instanceof MulterError)) return error
  if (error.code === 'LIMIT_FILE_SIZE') return new HttpError(413, 'too-large', `The caption file is larger than the ${sizeText(CAPTION_MAX_BYTES)} limit for caption files.`)
  if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
    return new HttpError(400, 'unexpected-file', `Send one caption file, in the form field "${CAPTION_FIELD}".`)
  }
  return new HttpError(400, 'bad-form', `The form could not be read: ${error.message}.`)
}
