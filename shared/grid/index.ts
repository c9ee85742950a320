/** Grid geometry shared by the engine, the script writer and the client's board: cells, houses, peers, digit masks, grid strings. */
export * from './geometry'
