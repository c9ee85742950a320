import { Transform } from 'node:stream'

/** A pass-through that counts what flows through it. */
export function byteCounter(): Transform & { bytes: number } {
  const counter = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      counter.bytes += chunk.length
      done(null, chunk)
    },
  }) as Transform & { bytes: number }
  counter.bytes = 0
  return counter
}
