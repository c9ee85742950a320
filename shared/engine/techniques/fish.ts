/**
 * Fish of size 2 (X-wing) and 3 (swordfish): n rows whose places for a digit all lie in the same
 * n columns. Each of those rows needs the digit once and no two of them can put it in one column,
 * so the n columns take their copies from these rows and the rest of each column loses the digit.
 * The same with columns as the base lines and rows as the cover.
 */
import { POPCOUNT, houseRef } from '../../grid'
import type { Board } from '../board'
import type { Cell, HouseRef } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** The X-wing (size 2) or swordfish (size 3) technique. */
export function fish(size: 2 | 3): Technique {
  const technique = size === 2 ? 'x-wing' : 'swordfish'
  // places[(byColumn × 9 + d − 1) × 9 + line]: the positions across the line where d can still go
  // (a mask over columns for a row, over rows for a column); 0 once d is placed in the line, since
  // placing removes it from the line's other cells
  const places = new Uint16Array(2 * 81)
  const lines = new Int8Array(9)
  const pick = new Int8Array(3)
  return {
    find(board, near) {
      places.fill(0)
      for (let c = 0; c < 81; c++) {
        if (board.digits[c]) continue
        const r = (c / 9) | 0
        const col = c - 9 * r
        for (let m = board.cand[c]; m; m &= m - 1) {
          const i = 31 - Math.clz32(m & -m)
          places[i * 9 + r] |= 1 << col
          places[81 + i * 9 + col] |= 1 << r
        }
      }
      const picker = new Picker(near)
      for (let d = 1; d <= 9 && !picker.settled; d++) {
        for (let byColumn = 0; byColumn < 2; byColumn++) {
          const at = (byColumn * 9 + d - 1) * 9
          let n = 0
          // one place is a single, found earlier; more than `size` places can't be a base line
          for (let i = 0; i < 9; i++) if (POPCOUNT[places[at + i]] >= 2 && POPCOUNT[places[at + i]] <= size) lines[n++] = i
          if (n < size) continue
          for (let a = 0; a < n; a++) {
            for (let b = a + 1; b < n; b++) {
              if (size === 2) {
                pick[0] = lines[a]
                pick[1] = lines[b]
                offer(board, picker, d, byColumn, at, 2)
                continue
              }
              for (let e = b + 1; e < n; e++) {
                pick[0] = lines[a]
                pick[1] = lines[b]
                pick[2] = lines[e]
                offer(board, picker, d, byColumn, at, 3)
              }
            }
          }
        }
      }
      return picker.best
    },
  }

  /** Offers the fish on the `count` lines in `pick`, if they cover exactly `count` crossing lines and clear something. */
  function offer(board: Board, picker: Picker, d: number, byColumn: number, at: number, count: number): void {
    let cover = 0
    let base = 0
    for (let k = 0; k < count; k++) {
      cover |= places[at + pick[k]]
      base |= 1 << pick[k]
    }
    if (POPCOUNT[cover] !== count) return
    let hits = false
    for (let i = 0; i < 9 && !hits; i++) if (!(base & (1 << i)) && places[at + i] & cover) hits = true
    if (!hits) return
    const cells: Cell[] = []
    const others: Cell[] = []
    for (let i = 0; i < 9; i++) {
      const where = places[at + i] & cover
      for (let j = 0; j < 9; j++) {
        if (!(where & (1 << j))) continue
        const c = byColumn ? j * 9 + i : i * 9 + j
        if (base & (1 << i)) cells.push(c)
        else others.push(c)
      }
    }
    cells.sort((x, y) => x - y)
    others.sort((x, y) => x - y)
    picker.offer(cells, () => {
      const baseLines = linesOf(base, byColumn ? 9 : 0)
      const coverLines = linesOf(cover, byColumn ? 0 : 9)
      return {
        technique,
        placements: [],
        eliminations: eliminationsOf(board, others, 1 << (d - 1)),
        focus: cells,
        reason: { houses: [...baseLines, ...coverLines], thermometers: [], cells },
        facts: { kind: 'fish', digit: d, baseLines, coverLines, cells, eliminated: others },
        difficulty: TECHNIQUES[technique].difficulty,
      }
    })
  }
}

/** House references for the lines set in a 9-bit mask; `first` is 0 for rows, 9 for columns. */
function linesOf(mask: number, first: number): HouseRef[] {
  const out: HouseRef[] = []
  for (let i = 0; i < 9; i++) if (mask & (1 << i)) out.push(houseRef(first + i))
  return out
}
