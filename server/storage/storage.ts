import type { Readable } from 'node:stream'

/** An inclusive byte range, as HTTP's Range header counts (RFC 9110 §14.1.2). */
export interface ByteRange {
  start: number
  end: number
}

/** Where recordings are kept: one small interface, a driver per kind of store. */
export interface Storage {
  readonly driver: 'disk' | 's3'
  /** streams body into the object; resolves with the byte count; on error or abort nothing is left behind */
  put(key: string, body: Readable, options?: { contentType?: string; signal?: AbortSignal }): Promise<{ sizeBytes: number }>
  /** the whole object or an inclusive byte range, as a stream */
  get(key: string, range?: ByteRange): Promise<Readable>
  /** null when absent */
  size(key: string): Promise<number | null>
  /** absent is fine */
  remove(key: string): Promise<void>
  /** a local file with the object's bytes for tools like ffmpeg: the file itself on disk, a temporary copy from S3 removed afterwards */
  withLocalFile<T>(key: string, use: (path: string) => Promise<T>): Promise<T>
}

/** Keys are ours (`recordings/12/<uuid>.webm`): plain segments only, so a key can never leave the store's folder. */
export function assertKey(key: string): void {
  if (!/^[A-Za-z0-9][\w-]*(\/[A-Za-z0-9][\w.-]*)*$/.test(key) || key.includes('..')) throw new Error(`not a storage key: ${JSON.stringify(key)}`)
}
