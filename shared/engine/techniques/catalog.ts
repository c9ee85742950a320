/** The techniques the engine knows: plain-words name first, trade term second, relative difficulty. */
import type { TechniqueId } from '../types'

interface TechniqueInfo {
  /** Gridcue's own words, shown first on screen */
  plainName: string
  /** the name solvers commonly use */
  tradeTerm: string
  /** relative effort to explain; the engine always tries easier techniques first */
  difficulty: number
}

/** Technique id → names and difficulty. */
export const TECHNIQUES: Readonly<Record<TechniqueId, TechniqueInfo>> = Object.freeze({
  'naked-single': { plainName: 'Last candidate in a cell', tradeTerm: 'naked single', difficulty: 1 },
  'hidden-single': { plainName: 'Only place for a digit in a row, column or box', tradeTerm: 'hidden single', difficulty: 1 },
  'thermo-length': { plainName: 'Thermometer length limits its cells', tradeTerm: 'thermometer length rule', difficulty: 1.5 },
  'thermo-bounds': { plainName: 'Thermometer bounds carried along its path', tradeTerm: 'thermometer bounds', difficulty: 2 },
  'locked-box-line': { plainName: "A box keeps a digit on one line", tradeTerm: 'locked candidates (pointing)', difficulty: 3 },
  'locked-line-box': { plainName: 'A line keeps a digit in one box', tradeTerm: 'locked candidates (claiming)', difficulty: 3 },
  'naked-pair': { plainName: 'Two cells holding the same two digits', tradeTerm: 'naked pair', difficulty: 3.5 },
  'hidden-pair': { plainName: 'Two digits with the same two places', tradeTerm: 'hidden pair', difficulty: 4 },
  'naked-triple': { plainName: 'Three cells holding three digits between them', tradeTerm: 'naked triple', difficulty: 4.5 },
  'hidden-triple': { plainName: 'Three digits with the same three places', tradeTerm: 'hidden triple', difficulty: 5 },
  'contradiction': { plainName: 'What-if that runs into a dead end', tradeTerm: 'contradiction', difficulty: 8 },
})
