/**
 * Structural reading of a puzzle: our JSON object, a JSON string, or a plain 81-character
 * givens string. Each problem becomes a ValidationError naming the cells involved.
 */
import { puzzleFileShape } from '../schemas/puzzle'
import { HOUSES, cellName, houseName, houseRef, kingAdjacent, parseCellName } from '../grid'
import type { Cell, Puzzle, ValidationError } from './types'

const UNTITLED = 'Untitled puzzle'

/** Reads a puzzle and checks its structure (not whether it has exactly one solution). */
export function parsePuzzle(input: unknown): { puzzle: Puzzle | null; errors: ValidationError[] } {
  const file = readFile(input)
  if ('error' in file) return { puzzle: null, errors: [file.error] }
  const errors: ValidationError[] = []

  const givens = readGivens(file.givens, errors)
  const thermometers: Cell[][] = []
  file.thermometers.forEach((names, t) => {
    const path = readThermometer(names, t, errors)
    if (path) thermometers.push(path)
  })
  if (givens) {
    checkDuplicates(givens, errors)
    if (thermometers.length === file.thermometers.length) checkThermometerOrder(givens, thermometers, errors)
  }
  if (errors.length || !givens) return { puzzle: null, errors }
  const puzzle: Puzzle = { title: file.title, givens, thermometers }
  if (file.author) puzzle.author = file.author
  return { puzzle, errors }
}

interface RawFile {
  title: string
  author?: string
  givens: string
  thermometers: string[][]
}

function readFile(input: unknown): RawFile | { error: ValidationError } {
  let value = input
  if (typeof input === 'string') {
    const text = input.trim()
    if (text.startsWith('{') || text.startsWith('[') || text.startsWith('"')) {
      try {
        value = JSON.parse(text)
      } catch (e) {
        return { error: malformed(`The puzzle is not valid JSON: ${(e as Error).message}`) }
      }
      if (typeof value === 'string') return { title: UNTITLED, givens: value.trim(), thermometers: [] }
    } else {
      return { title: UNTITLED, givens: text, thermometers: [] }
    }
  }
  value = fromPuzzleObject(value)
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    return { error: malformed('The puzzle must be a JSON object with "title", "givens" and "thermometers", or an 81-character givens string.') }
  }
  const parsed = puzzleFileShape.safeParse(value)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]
    const where = issue.path.length ? issue.path.join('.') : 'puzzle'
    return { error: malformed(`The puzzle file is malformed at "${where}": ${issue.message}.`) }
  }
  return parsed.data
}

/** A Puzzle already in memory (digits and cell indexes) is read through the same checks as a file. */
function fromPuzzleObject(value: unknown): unknown {
  if (typeof value !== 'object' || value === null) return value
  const v = value as { givens?: unknown; thermometers?: unknown }
  const numeric = (x: unknown): x is ArrayLike<number> => (Array.isArray(x) || x instanceof Uint8Array) && Array.from(x as ArrayLike<unknown>).every((n) => typeof n === 'number')
  if (!numeric(v.givens)) return value
  const givens = Array.from(v.givens, (d) => (d >= 1 && d <= 9 ? String(d) : d === 0 ? '.' : '?')).join('')
  const thermometers = Array.isArray(v.thermometers)
    ? v.thermometers.map((t: unknown) => (Array.isArray(t) ? t.map((c) => (Number.isInteger(c) && c >= 0 && c <= 80 ? cellName(c) : String(c))) : t))
    : v.thermometers
  return { ...value, givens, thermometers }
}

function readGivens(text: string, errors: ValidationError[]): Uint8Array | null {
  if (text.length !== 81) {
    errors.push({ code: 'givens-length', message: `The givens must be 81 characters (9 rows of 9); this has ${text.length}.`, cells: [] })
    return null
  }
  const givens = new Uint8Array(81)
  let ok = true
  for (let c = 0; c < 81; c++) {
    const ch = text[c]
    if (ch >= '1' && ch <= '9') givens[c] = ch.charCodeAt(0) - 48
    else if (ch !== '.' && ch !== '0') {
      ok = false
      errors.push({ code: 'givens-character', message: `Character ${c + 1} of the givens (${cellName(c)}) is "${ch}"; use 1-9 for a given and "." for an empty cell.`, cells: [c] })
    }
  }
  return ok ? givens : null
}

function readThermometer(names: string[], t: number, errors: ValidationError[]): Cell[] | null {
  const label = `Thermometer ${t + 1}`
  const cells: Cell[] = []
  let ok = true
  names.forEach((name, i) => {
    const cell = parseCellName(name)
    if (cell === null) {
      ok = false
      errors.push({ code: 'thermometer-bad-cell', message: `${label}, cell ${i + 1}: "${name}" is not a cell name such as r3c4 (row and column 1-9).`, cells: [] })
    } else cells.push(cell)
  })
  if (!ok) return null
  if (cells.length < 2) {
    errors.push({ code: 'thermometer-too-short', message: `${label} has ${cells.length} cell${cells.length === 1 ? '' : 's'}; a thermometer needs at least 2.`, cells })
    return null
  }
  if (cells.length > 9) {
    errors.push({ code: 'thermometer-too-long', message: `${label} has ${cells.length} cells; digits must rise along it, so it can have at most 9.`, cells })
    return null
  }
  const seen = new Set<Cell>()
  for (const c of cells) {
    if (seen.has(c)) {
      errors.push({ code: 'thermometer-repeated-cell', message: `${label} passes through ${cellName(c)} twice.`, cells: [c] })
      return null
    }
    seen.add(c)
  }
  for (let i = 1; i < cells.length; i++) {
    if (!kingAdjacent(cells[i - 1], cells[i])) {
      errors.push({
        code: 'thermometer-not-adjacent',
        message: `${label}: ${cellName(cells[i - 1])} and ${cellName(cells[i])} follow each other on it but do not touch (side or corner).`,
        cells: [cells[i - 1], cells[i]],
      })
      return null
    }
  }
  return cells
}

function checkDuplicates(givens: Uint8Array, errors: ValidationError[]): void {
  for (let h = 0; h < 27; h++) {
    const byDigit = new Map<number, Cell[]>()
    for (const c of HOUSES[h]) {
      const d = givens[c]
      if (d) byDigit.set(d, [...(byDigit.get(d) ?? []), c])
    }
    for (const [d, cells] of byDigit) {
      if (cells.length > 1) {
        errors.push({ code: 'duplicate-given', message: `${capitalise(houseName(houseRef(h)))} has the given ${d} more than once: ${cells.map(cellName).join(', ')}.`, cells })
      }
    }
  }
}

/** Givens on one thermometer must rise, with room for the cells between them. */
function checkThermometerOrder(givens: Uint8Array, thermometers: Cell[][], errors: ValidationError[]): void {
  thermometers.forEach((path, t) => {
    const n = path.length
    const label = `Thermometer ${t + 1}`
    for (let i = 0; i < n; i++) {
      const d = givens[path[i]]
      if (!d) continue
      if (d < i + 1 || d > 10 - n + i) {
        errors.push({
          code: 'thermometer-order',
          message: `${label}: ${cellName(path[i])} is cell ${i + 1} of ${n}, so it must hold ${i + 1} to ${10 - n + i}; its given is ${d}.`,
          cells: [path[i]],
        })
        continue
      }
      for (let j = i + 1; j < n; j++) {
        const e = givens[path[j]]
        if (!e) continue
        if (e - d < j - i) {
          errors.push({
            code: 'thermometer-order',
            message: `${label}: ${cellName(path[i])} (${d}) comes before ${cellName(path[j])} (${e}), so the digits cannot rise along it${j - i > 1 ? ' with room for the cells between' : ''}.`,
            cells: [path[i], path[j]],
          })
        }
        break
      }
    }
  })
}

function malformed(message: string): ValidationError {
  return { code: 'malformed', message, cells: [] }
}

function capitalise(s: string): string {
  return s[0].toUpperCase() + s.slice(1)
}
