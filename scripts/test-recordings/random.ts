/** A seeded source in [0, 1), so every test recording can be made again exactly. */
export type Random = () => number

// one seeded generator for every generated fixture: the thermometer puzzles' and the recordings'
export { seededRandom } from '../../tests/helpers/generate-thermo'

export function between(random: Random, low: number, high: number): number {
  return low + random() * (high - low)
}

export function pick<T>(random: Random, items: readonly T[]): T {
  return items[Math.floor(random() * items.length)]
}
