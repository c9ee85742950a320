import { computed, ref, shallowRef, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { cellName, parseCellName } from '@shared/engine'

/** What the grid editor holds: givens as 81 digits (0 = empty) and thermometers as cell paths, bulb first. */
export interface PuzzleGrid {
  givens: number[]
  thermometers: number[][]
}

export interface PuzzleEntryOptions {
  /** When false, the grid only shows the puzzle: input handlers do nothing. */
  editable?: MaybeRefOrGetter<boolean>
}

/** The longest thermometer the rules allow: digits strictly rise along it. */
const MAX_THERMOMETER = 9
const UNDO_LIMIT = 200

/**
 * Grid editing for the Puzzle screen: selection, keyboard entry, paste, thermometer drawing and undo.
 * Wire the returned handlers to GridBoard's events and to the grid's keydown and paste.
 */
export function usePuzzleEntry(options: PuzzleEntryOptions = {}) {
  // Each change replaces the arrays (no deep reactivity): cheap to snapshot for undo and to watch for the check.
  const givens = shallowRef<number[]>(emptyGivens())
  const thermometers = shallowRef<number[][]>([])
  const selected = ref<number | null>(null)
  const selectedThermometer = ref<number | null>(null)
  /** The thermometer being drawn by a drag, bulb first; null when no drag is under way. */
  const drawing = shallowRef<number[] | null>(null)
  const history = shallowRef<PuzzleGrid[]>([])

  const editable = () => toValue(options.editable) ?? true
  const canUndo = computed(() => history.value.length > 0)
  const givensString = computed(() => givens.value.map((d) => (d ? String(d) : '.')).join(''))
  const thermometerNames = computed(() => thermometers.value.map((path) => path.map(cellName)))
  /** Thermometers to draw: the saved ones plus the one under the pointer once it has two cells. */
  const shownThermometers = computed(() =>
    drawing.value && drawing.value.length > 1 ? [...thermometers.value, drawing.value] : thermometers.value,
  )
  /** The 81 "given" flags GridBoard wants: during entry every digit is a given. */
  const givenFlags = computed(() => givens.value.map((d) => (d ? 1 : 0)))

  function snapshot(): PuzzleGrid {
    return { givens: givens.value, thermometers: thermometers.value }
  }

  function commit(next: Partial<PuzzleGrid>): void {
    history.value = [...history.value.slice(-(UNDO_LIMIT - 1)), snapshot()]
    if (next.givens) givens.value = next.givens
    if (next.thermometers) thermometers.value = next.thermometers
  }

  /** Replaces the whole grid (a loaded or imported puzzle); clears undo. */
  function load(grid: { givens: string | ArrayLike<number>; thermometers: (string[] | number[])[] }): void {
    givens.value = typeof grid.givens === 'string' ? readGivens(grid.givens) ?? emptyGivens() : Array.from(grid.givens, (d) => (d >= 1 && d <= 9 ? d : 0))
    thermometers.value = grid.thermometers.map((path) =>
      (path as (string | number)[]).map((c) => (typeof c === 'number' ? c : parseCellName(c) ?? -1)).filter((c) => c >= 0 && c <= 80),
    )
    history.value = []
    selectedThermometer.value = null
    drawing.value = null
  }

  function undo(): void {
    const past = history.value
    if (!past.length || !editable()) return
    const previous = past[past.length - 1]
    history.value = past.slice(0, -1)
    givens.value = previous.givens
    thermometers.value = previous.thermometers
    if (selectedThermometer.value !== null && selectedThermometer.value >= previous.thermometers.length) selectedThermometer.value = null
  }

  function setGiven(cell: number, digit: number): void {
    if (!editable() || cell < 0 || cell > 80 || givens.value[cell] === digit) return
    const next = givens.value.slice()
    next[cell] = digit
    commit({ givens: next })
  }

  function select(cell: number | null): void {
    selected.value = cell
    selectedThermometer.value = null
  }

  /** Keyboard users land on r1c1 when the grid takes focus with nothing selected. */
  function ensureSelection(): void {
    if (selected.value === null) selected.value = 0
  }

  function removeThermometer(index: number): void {
    if (!editable() || index < 0 || index >= thermometers.value.length) return
    commit({ thermometers: thermometers.value.filter((_, i) => i !== index) })
    selectedThermometer.value = null
  }

  /**
   * Adds a thermometer from cell names ("r1c1 r2c2 r3c3", bulb first). Returns a problem to show, or null when
   * added: the keyboard's way to draw one.
   */
  function addThermometerFromText(text: string): string | null {
    const names = text.split(/[\s,;>→-]+/).filter(Boolean)
    const cells: number[] = []
    for (const name of names) {
      const cell = parseCellName(name)
      if (cell === null) return `"${name}" is not a cell name such as r3c4.`
      cells.push(cell)
    }
    if (cells.length < 2) return 'A thermometer needs at least two cells, bulb first.'
    if (cells.length > MAX_THERMOMETER) return `A thermometer has at most ${MAX_THERMOMETER} cells.`
    if (new Set(cells).size !== cells.length) return 'A thermometer passes through each cell once.'
    for (let i = 1; i < cells.length; i++) {
      if (!touching(cells[i - 1], cells[i])) return `${cellName(cells[i - 1])} and ${cellName(cells[i])} don't touch; each cell must touch the next (side or corner).`
    }
    if (!editable()) return 'This puzzle is read-only for you.'
    commit({ thermometers: [...thermometers.value, cells] })
    selectedThermometer.value = thermometers.value.length - 1
    return null
  }

  /** Reads 81 givens (1-9, with '.' or 0 for empty; spaces and line breaks ignored). Returns false if it isn't that. */
  function pasteGivens(text: string): boolean {
    const next = readGivens(text)
    if (!next || !editable()) return false
    commit({ givens: next })
    return true
  }

  // --- GridBoard events ---

  function onCellDown(cell: number, event?: PointerEvent): void {
    if (event && event.button > 0) return
    select(cell)
    drawing.value = editable() ? [cell] : null
  }

  function onCellEnter(cell: number): void {
    const path = drawing.value
    if (!path) return
    const last = path[path.length - 1]
    if (cell === last) return
    // Going back over the previous cell takes the last cell off again.
    if (path.length > 1 && cell === path[path.length - 2]) {
      drawing.value = path.slice(0, -1)
      return
    }
    // A jump (pointer moved fast, or to a cell that doesn't touch) or a loop is ignored; the drag continues.
    if (!touching(last, cell) || path.includes(cell) || path.length >= MAX_THERMOMETER) return
    drawing.value = [...path, cell]
  }

  function onCellUp(): void {
    const path = drawing.value
    drawing.value = null
    if (!path || path.length < 2 || !editable()) return
    commit({ thermometers: [...thermometers.value, path] })
    selected.value = path[path.length - 1]
    selectedThermometer.value = thermometers.value.length - 1
  }

  function onThermometerClick(index: number): void {
    if (index >= 0 && index < thermometers.value.length) selectedThermometer.value = index
  }

  function onKeydown(event: KeyboardEvent): void {
    const key = event.key
    if ((event.ctrlKey || event.metaKey) && !event.altKey && key.toLowerCase() === 'z' && !event.shiftKey) {
      event.preventDefault()
      undo()
      return
    }
    if (event.ctrlKey || event.metaKey || event.altKey) return

    const move = ARROWS[key]
    if (move) {
      event.preventDefault()
      const from = selected.value
      if (from === null) {
        select(0)
        return
      }
      const row = Math.min(8, Math.max(0, Math.floor(from / 9) + move[0]))
      const col = Math.min(8, Math.max(0, (from % 9) + move[1]))
      select(row * 9 + col)
      return
    }
    if (key === 'Escape') {
      if (drawing.value || selectedThermometer.value !== null) {
        event.preventDefault()
        drawing.value = null
        selectedThermometer.value = null
      }
      return
    }
    if (/^[1-9]$/.test(key) && selected.value !== null) {
      event.preventDefault()
      selectedThermometer.value = null
      setGiven(selected.value, Number(key))
      return
    }
    if (key === 'Backspace' || key === 'Delete' || key === '0' || key === '.') {
      event.preventDefault()
      if (selectedThermometer.value !== null && (key === 'Backspace' || key === 'Delete')) removeThermometer(selectedThermometer.value)
      else if (selected.value !== null) setGiven(selected.value, 0)
    }
  }

  /** Paste into the focused grid: an 81-character givens string. Returns whether it was taken. */
  function onPaste(event: ClipboardEvent): boolean {
    const text = event.clipboardData?.getData('text/plain') ?? ''
    const taken = pasteGivens(text)
    if (taken) event.preventDefault()
    return taken
  }

  return {
    givens,
    thermometers,
    selected,
    selectedThermometer,
    drawing,
    canUndo,
    givensString,
    thermometerNames,
    shownThermometers,
    givenFlags,
    load,
    undo,
    select,
    ensureSelection,
    setGiven,
    removeThermometer,
    addThermometerFromText,
    pasteGivens,
    onCellDown,
    onCellEnter,
    onCellUp,
    onThermometerClick,
    onKeydown,
    onPaste,
  }
}

export type PuzzleEntry = ReturnType<typeof usePuzzleEntry>

const ARROWS: Record<string, [number, number]> = {
  ArrowUp: [-1, 0],
  ArrowDown: [1, 0],
  ArrowLeft: [0, -1],
  ArrowRight: [0, 1],
}

function emptyGivens(): number[] {
  return new Array<number>(81).fill(0)
}

function readGivens(text: string): number[] | null {
  const compact = text.replace(/\s+/g, '')
  if (!/^[0-9.]{81}$/.test(compact)) return null
  return Array.from(compact, (ch) => (ch === '.' ? 0 : Number(ch)))
}

function touching(a: number, b: number): boolean {
  return a !== b && Math.abs(Math.floor(a / 9) - Math.floor(b / 9)) <= 1 && Math.abs((a % 9) - (b % 9)) <= 1
}
