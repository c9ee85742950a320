import type { Knex } from 'knex'

/**
 * Single-cell steps kept the digits their cell lost to earlier steps under `facts.seen.thermometer`,
 * a wrong name (pairs and locked candidates remove digits too); it is now `facts.seen.ruledOut`.
 * Steps live inside `outlines.document`, so the key is renamed there in one statement. Only the key
 * moves: script text people saw or edited stays exactly as it was saved.
 */
export async function up(knex: Knex): Promise<void> {
  await renameSeenKey(knex, 'thermometer', 'ruledOut')
}

export async function down(knex: Knex): Promise<void> {
  await renameSeenKey(knex, 'ruledOut', 'thermometer')
}

async function renameSeenKey(knex: Knex, from: string, to: string): Promise<void> {
  // jsonpath tests instead of jsonb's `?` operator, which knex would read as a binding
  const inStep = `$.facts.seen."${from}"`
  const inDocument = `$.steps[*].facts.seen."${from}"`
  await knex.raw(
    `update outlines
        set document = jsonb_set(document, '{steps}', (
          select jsonb_agg(
                   case when jsonb_path_exists(step, cast(? as jsonpath))
                        then jsonb_set(step, '{facts,seen}',
                               ((step #> '{facts,seen}') - cast(? as text)) || jsonb_build_object(cast(? as text), step #> array['facts', 'seen', cast(? as text)]))
                        else step
                   end
                   order by position)
            from jsonb_array_elements(document -> 'steps') with ordinality as steps(step, position)))
      where jsonb_path_exists(document, cast(? as jsonpath))`,
    [inStep, from, to, from, inDocument],
  )
}
