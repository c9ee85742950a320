/** The grid pictures the page shows: the shared `boardAt` on the published steps, or a nudge's area on it. */
import { boardAt } from '@shared/picture/board-at'
import type { BoardPicture } from '@shared/picture/board-at'
import type { EpisodePage } from '@shared/schemas/episode'
import type { NudgeArea } from './nudge'

/** The grid after `k` published steps, with that step's highlights (what the studio shows at that step). */
export function pageBoard(page: Pick<EpisodePage, 'puzzle' | 'steps'>, k: number): BoardPicture {
  // a published episode plays its path as far as it goes; where a stuck path stops is the studio's concern
  return boardAt({ puzzle: page.puzzle, steps: page.steps, status: 'solved' }, k)
}

/** The same digits and candidates with only an area tinted: a first or second nudge shows where, never what. */
export function withArea(board: BoardPicture, area: NudgeArea): BoardPicture {
  return { ...board, focus: [], reasonCells: [], reasonHouses: area.houses, reasonThermometers: area.thermometers, eliminated: [], placed: [], chain: [] }
}
