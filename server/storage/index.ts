import type { Config } from '../config'
import { diskStorage } from './disk'
import { s3Storage } from './s3'
import type { Storage } from './storage'

export type { ByteRange, Storage } from './storage'

/** The driver the configuration names. */
export function createStorage(settings: Config['storage']): Storage {
  return settings.driver === 'disk' ? diskStorage(settings.dir) : s3Storage(settings)
}
