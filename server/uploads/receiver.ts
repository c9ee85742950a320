import type { Request, Response } from 'express'
import { fileTypeStream } from 'file-type/node'
import multer, { MulterError, type StorageEngine } from 'multer'
import { HttpError } from '../errors'
import type { Storage } from '../storage'
import { sizeText } from './size-text'

/** A file as it was stored: under our own key, its type found from its content. */
export interface StoredUpload {
  key: string
  /** the name the sender gave it, for people only */
  originalName: string
  mime: string
  /** file-type's extension for the content, e.g. 'webm' */
  ext: string
  sizeBytes: number
  /** removes the file from storage, for whoever can't use it after all */
  discard: () => Promise<void>
}

type StoredFile = Omit<StoredUpload, 'discard'>

/** Receives a multipart request's one file into storage and resolves with it (undefined when the request carried none). */
export type UploadReceiver = (req: Request, res: Response) => Promise<StoredUpload | undefined>

interface UploadRules {
  storage: Storage
  /** the form field the file comes in */
  field: string
  maxBytes: number
  /** top-level media types the content may have, e.g. ['audio', 'video'] */
  kinds: readonly string[]
  /** what to call such files in a refusal: "an audio or video file" */
  kindsText: string
  /** our own storage key for a file of this type */
  keyOf: (req: Request, ext: string) => string
}

// a few form fields beside the file are plenty; anything more is not a form of ours
const FIELD_LIMITS = { files: 1, fields: 10, fieldSize: 64 * 1024, parts: 12 }

/**
 * A receiver that streams the file through content sniffing into storage, never holding it whole.
 * Refusals are HttpErrors: 415 for content of another type, 413 over the size limit, 400 for a broken
 * or interrupted request; in every case nothing stays in storage.
 */
export function uploadReceiver(rules: UploadRules): UploadReceiver {
  const receive = multer({ storage: sniffingEngine(rules), limits: { ...FIELD_LIMITS, fileSize: rules.maxBytes } }).single(rules.field)
  return (req, res) =>
    new Promise((resolve, reject) => {
      receive(req, res, (error?: unknown) => {
        if (error) return reject(refusal(error, rules))
        const file = req.file as (Express.Multer.File & StoredFile) | undefined
        resolve(file && { key: file.key, originalName: file.originalName, mime: file.mime, ext: file.ext, sizeBytes: file.sizeBytes, discard: () => rules.storage.remove(file.key) })
      })
    })
}

/** multer's storage engine: sniff the first bytes, refuse what isn't allowed, stream the rest to storage. */
function sniffingEngine({ storage, kinds, kindsText, keyOf }: UploadRules): StorageEngine {
  async function store(req: Request, file: Express.Multer.File, signal: AbortSignal): Promise<StoredFile> {
    const sniffed = await fileTypeStream(file.stream)
    const type = sniffed.fileType
    if (!type || !kinds.includes(type.mime.split('/')[0] ?? '')) {
      throw new HttpError(415, 'unsupported-type', `"${file.originalname}" is not ${kindsText}.`)
    }
    const key = keyOf(req, type.ext)
    const { sizeBytes } = await storage.put(key, sniffed, { contentType: type.mime, signal })
    return { key, originalName: file.originalname, mime: type.mime, ext: type.ext, sizeBytes }
  }

  return {
    _handleFile(req, file, done) {
      const controller = new AbortController()
      // busboy stops the file at the limit and ends it as if it were whole: the put must not complete
      file.stream.once('limit', () => controller.abort())
      store(req, file, controller.signal).then(
        (stored) => done(null, { ...stored, size: stored.sizeBytes }),
        (error: unknown) => done(error as Error),
      )
    },
    _removeFile(_req, file, done) {
      storage.remove((file as Express.Multer.File & StoredFile).key).then(() => done(null), done)
    },
  }
}

function refusal(error: unknown, { field, maxBytes }: UploadRules): unknown {
  if (error instanceof HttpError) return error
  if (error instanceof MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new HttpError(413, 'too-large', `The file is larger than the ${sizeText(maxBytes)} limit for uploads. Nothing was kept.`)
    }
    if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
      return new HttpError(400, 'unexpected-file', `Send one file, in the form field "${field}".`)
    }
    return new HttpError(400, 'bad-form', `The upload form could not be read: ${error.message}.`)
  }
  // the sender went away or the body broke off: no one may be listening, but nothing was kept either way
  if (error instanceof Error && /^Request (aborted|closed|error)$|Unexpected end of form|Malformed part header/.test(error.message)) {
    return new HttpError(400, 'upload-interrupted', 'The upload stopped before the whole file arrived. Nothing was kept; please send it again.')
  }
  return error
}
