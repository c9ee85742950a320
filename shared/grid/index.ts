/** Grid geometry shared by the engine, the script writer and the client's board: cells, houses, peers, digit masks, grid strings. */
export * from './geometry'
// The basic vocabulary is defined with the step contract's schemas; the grid hands it on.
export type { Cell, Digit, HouseRef } from '../schemas/step'
