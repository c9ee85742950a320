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
  'thermo-pointing': { plainName: "A house's places for a digit all sit on one side of a thermometer cell", tradeTerm: 'house and thermometer', difficulty: 3.25 },
  'thermo-either': { plainName: 'Either place for a digit rules out the same cell', tradeTerm: 'two places and a thermometer', difficulty: 3.4 },
  'naked-pair': { plainName: 'Two cells holding the same two digits', tradeTerm: 'naked pair', difficulty: 3.5 },
  'hidden-pair': { plainName: 'Two digits with the same two places', tradeTerm: 'hidden pair', difficulty: 4 },
  'thermo-ends': { plainName: 'Either place for a digit fills its thermometer to the tip (or down to the bulb)', tradeTerm: 'two tips or two bulbs', difficulty: 4.25 },
  'naked-triple': { plainName: 'Three cells holding three digits between them', tradeTerm: 'naked triple', difficulty: 4.5 },
  'hidden-triple': { plainName: 'Three digits with the same three places', tradeTerm: 'hidden triple', difficulty: 5 },
  'x-wing': { plainName: 'Two lines lock a digit into two crossing lines', tradeTerm: 'X-wing', difficulty: 5.5 },
  'xy-wing': { plainName: 'A two-way cell forces one of two partners', tradeTerm: 'XY-wing', difficulty: 6 },
  'swordfish': { plainName: 'Three lines lock a digit into three crossing lines', tradeTerm: 'swordfish', difficulty: 6.5 },
  'xyz-wing': { plainName: 'A three-way cell and two partners share a digit', tradeTerm: 'XYZ-wing', difficulty: 7 },
  'w-wing': { plainName: "Two matching pairs joined by a digit's two places", tradeTerm: 'W-wing', difficulty: 7.5 },
  'either-way': { plainName: 'Either choice of a two-way cell or a two-place digit leads to the same result', tradeTerm: 'forcing chain', difficulty: 7.75 },
  'contradiction': { plainName: 'What-if that runs into a dead end', tradeTerm: 'contradiction', difficulty: 8 },
})
