import { randomUUID } from 'node:crypto'
import { createReadStream, createWriteStream } from 'node:fs'
import { mkdir, rename, rm, stat } from 'node:fs/promises'
import { dirname, join, resolve } from 'node:path'
import { pipeline } from 'node:stream/promises'
import { byteCounter } from './byte-counter'
import { assertKey, type Storage } from './storage'

/** Objects as files under one folder. A put writes to a temporary name beside the target and renames it when complete. */
export function diskStorage(dir: string): Storage {
  const root = resolve(dir)
  const pathOf = (key: string) => {
    assertKey(key)
    return join(root, key)
  }

  return {
    driver: 'disk',
    async put(key, body, { signal } = {}) {
      const target = pathOf(key)
      await mkdir(dirname(target), { recursive: true })
      // a dot name nobody lists as an object, removed again whatever goes wrong
      const partial = join(dirname(target), `.${randomUUID()}.partial`)
      const counter = byteCounter()
      try {
        await pipeline(body, counter, createWriteStream(partial, { flags: 'wx' }), { signal })
        await rename(partial, target)
      } catch (error) {
        await rm(partial, { force: true })
        throw error
      }
      return { sizeBytes: counter.bytes }
    },
    async get(key, range) {
      const path = pathOf(key)
      await stat(path) // a missing object fails here, not later in the middle of a response
      return createReadStream(path, range ? { start: range.start, end: range.end } : {})
    },
    async size(key) {
      try {
        return (await stat(pathOf(key))).size
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null
        throw error
      }
    },
    async remove(key) {
      await rm(pathOf(key), { force: true })
    },
    async withLocalFile(key, use) {
      const path = pathOf(key)
      await stat(path)
      return use(path)
    },
  }
}
