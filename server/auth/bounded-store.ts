import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit'

interface Counter {
  totalHits: number
  resetTime: Date
}

/**
 * An express-rate-limit store in process memory that never holds more than `maxKeys` counters, however
 * many callers come. Each counter lives for one window from its first hit; the Map's insertion order is
 * then the order the windows end, so expired counters are dropped from its front as new ones arrive, and
 * when it is full of live ones the counter closest to its reset goes first.
 */
export class BoundedMemoryStore implements Store {
  readonly localKeys = true
  private windowMs = 60_000
  private readonly counters = new Map<string, Counter>()

  constructor(private readonly maxKeys: number) {}

  init(options: Options): void {
    this.windowMs = options.windowMs
  }

  /** How many counters the store holds now. */
  get size(): number {
    return this.counters.size
  }

  get(key: string): ClientRateLimitInfo | undefined {
    return this.live(key)
  }

  increment(key: string): ClientRateLimitInfo {
    const counter = this.live(key) ?? this.add(key)
    counter.totalHits++
    return { ...counter }
  }

  decrement(key: string): void {
    const counter = this.live(key)
    if (counter && counter.totalHits > 0) counter.totalHits--
  }

  resetKey(key: string): void {
    this.counters.delete(key)
  }

  resetAll(): void {
    this.counters.clear()
  }

  private live(key: string): Counter | undefined {
    const counter = this.counters.get(key)
    if (!counter || counter.resetTime.getTime() > Date.now()) return counter
    this.counters.delete(key)
    return undefined
  }

  private add(key: string): Counter {
    const now = Date.now()
    for (const [oldest, counter] of this.counters) {
      if (this.counters.size < this.maxKeys && counter.resetTime.getTime() > now) break
      this.counters.delete(oldest)
    }
    const counter = { totalHits: 0, resetTime: new Date(now + this.windowMs) }
    this.counters.set(key, counter)
    return counter
  }
}
