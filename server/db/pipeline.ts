import type { Role } from '../../shared/schemas/auth'
import { TAKE_STAGES, type TakeStage } from '../../shared/schemas/pipeline'
import type { Db } from './knex'

/** A take as the board shows it, its planned day as 'YYYY-MM-DD' text (pg would make a date column a local-midnight Date). */
export interface BoardTakeRow {
  id: number
  name: string
  puzzle_id: number
  puzzle_title: string
  stage: TakeStage
  planned_on: string | null
  assignee_id: number | null
  /** null when nobody is on it, or the person is no longer a member */
  assignee_name: string | null
  has_recording: boolean
}

const boardTakes = (db: Db, channelId: number) =>
  db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .leftJoin('memberships', (j) => j.on('memberships.user_id', 'outlines.assignee_id').andOn('memberships.channel_id', 'puzzles.channel_id'))
    .leftJoin('users', 'users.id', 'memberships.user_id')
    .where('puzzles.channel_id', channelId)
    .select<BoardTakeRow[]>(
      'outlines.id',
      'outlines.name',
      'outlines.puzzle_id',
      'puzzles.title as puzzle_title',
      'outlines.stage',
      db.raw("to_char(outlines.planned_on, 'YYYY-MM-DD') as planned_on"),
      'outlines.assignee_id',
      'users.name as assignee_name',
      db.raw('exists (select 1 from recordings r where r.outline_id = outlines.id) as has_recording'),
    )

/** Every take of the channel, by planned day (unplanned last), then oldest first. */
export function listBoardTakes(db: Db, channelId: number): Promise<BoardTakeRow[]> {
  return boardTakes(db, channelId).orderByRaw('outlines.planned_on asc nulls last, outlines.id asc')
}

export async function findBoardTake(db: Db, channelId: number, outlineId: number): Promise<BoardTakeRow | undefined> {
  const [row] = await boardTakes(db, channelId).where('outlines.id', outlineId)
  return row
}

export async function setStage(db: Db, outlineId: number, stage: TakeStage): Promise<void> {
  await db('outlines').where({ id: outlineId }).update({ stage })
}

/**
 * Moves a take on to `stage` only when it is at an earlier one (an upload never takes a published take back);
 * the stage it was at when it moved, or undefined when it stayed.
 */
export async function advanceStage(db: Db, outlineId: number, stage: TakeStage): Promise<TakeStage | undefined> {
  const earlier = TAKE_STAGES.slice(0, TAKE_STAGES.indexOf(stage))
  if (earlier.length === 0) return undefined
  const result = await db.raw<{ rows: { before: TakeStage }[] }>(
    `update outlines set stage = ? from (select id, stage from outlines where id = ? for update) as old
     where outlines.id = old.id and old.stage = any(?::take_stage[]) returning old.stage as before`,
    [stage, outlineId, earlier],
  )
  return result.rows[0]?.before
}

export async function setPlan(db: Db, outlineId: number, plan: { planned_on?: string | null; assignee_id?: number | null }): Promise<void> {
  await db('outlines').where({ id: outlineId }).update(plan)
}

export async function findCadence(db: Db, channelId: number): Promise<number> {
  const row = await db('channels').where({ id: channelId }).first('cadence_days')
  return row?.cadence_days ?? 0
}

export async function setCadence(db: Db, channelId: number, cadenceDays: number): Promise<void> {
  await db('channels').where({ id: channelId }).update({ cadence_days: cadenceDays })
}

/** The channel's members with one of the roles, by name. */
export function listPeopleWithRoles(db: Db, channelId: number, roles: readonly Role[]): Promise<{ user_id: number; name: string; email: string; role: Role }[]> {
  return db('memberships')
    .join('users', 'users.id', 'memberships.user_id')
    .where('memberships.channel_id', channelId)
    .whereIn('memberships.role', roles)
    .orderBy('users.name')
    .select('users.id as user_id', 'users.name', 'users.email', 'memberships.role')
}

/** The channel and take an alignment run belongs to; undefined when the run went with its recording. */
export function findRunTake(db: Db, runId: number): Promise<{ channel_id: number; outline_id: number } | undefined> {
  return db('alignment_runs')
    .join('recordings', 'recordings.id', 'alignment_runs.recording_id')
    .join('outlines', 'outlines.id', 'recordings.outline_id')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('alignment_runs.id', runId)
    .first('puzzles.channel_id', 'outlines.id as outline_id')
}
