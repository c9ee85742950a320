/**
 * Tables keyed by facts kind, in place of `switch (facts.kind)`: a table must have an entry for
 * every kind, so a new kind of facts fails to compile until each table says what to do with it.
 */
import type { FactsKind, FactsOf, StepFacts } from './types'

/** One function per facts kind, each handed the facts narrowed to its kind. */
export type FactsTable<R, A extends unknown[] = []> = { readonly [K in FactsKind]: (f: FactsOf<K>, ...args: A) => R }

/** Runs the table's entry for the kind of these facts. */
export function byFactsKind<R, A extends unknown[]>(table: FactsTable<R, A>, f: StepFacts, ...args: A): R {
  // TypeScript can't tie `table[f.kind]` to the narrowed `f`; the tables' own types keep it honest.
  return (table[f.kind] as (f: StepFacts, ...args: A) => R)(f, ...args)
}
