import { STAGE_LABELS, canMoveInto, type Board, type BoardTake, type CadenceUpdate, type TakePlan, type TakeStage } from '../../shared/schemas/pipeline'
import type { Db } from '../db/knex'
import { findRole } from '../db/memberships'
import { advanceStage, findBoardTake, findCadence, findRunTake, listBoardTakes, listPeopleWithRoles, setCadence, setPlan, setStage, type BoardTakeRow } from '../db/pipeline'
import { HttpError, forbidden, notFound } from '../errors'
import { recordAudit } from './audit'
import { notify } from './notifications'

// who is told about what: the people who work on the take next, and whoever is on it
const STUDIO_TEAM = ['owner', 'presenter', 'editor'] as const
const POST_PRODUCTION = ['owner', 'editor'] as const

const toBoardTake = (row: BoardTakeRow): BoardTake => ({
  outlineId: row.id,
  name: row.name,
  puzzleId: row.puzzle_id,
  puzzleTitle: row.puzzle_title,
  stage: row.stage,
  plannedOn: row.planned_on,
  assignee: row.assignee_id !== null && row.assignee_name !== null ? { userId: row.assignee_id, name: row.assignee_name } : null,
  hasRecording: row.has_recording,
})

const takeLink = (channelId: number, outlineId: number) => `/channels/${channelId}/outlines/${outlineId}`
const takeTitle = (row: BoardTakeRow) => `"${row.puzzle_title}" (${row.name})`

/** Every take of the channel with its stage and plan, the cadence, and who can be put on a take. */
export async function boardOf(db: Db, channelId: number): Promise<Board> {
  const [cadenceDays, people, takes] = await Promise.all([findCadence(db, channelId), listPeopleWithRoles(db, channelId, STUDIO_TEAM), listBoardTakes(db, channelId)])
  return { cadenceDays, people: people.map((p) => ({ userId: p.user_id, name: p.name })), takes: takes.map(toBoardTake) }
}

async function existingTake(db: Db, channelId: number, outlineId: number): Promise<BoardTakeRow> {
  const row = await findBoardTake(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  return row
}

/** An explicit move by a person: their role must allow the stage, and the move must make sense for the take. */
export async function moveTake(db: Db, channelId: number, outlineId: number, stage: TakeStage, user: Express.User): Promise<BoardTake> {
  const take = await existingTake(db, channelId, outlineId)
  const role = await findRole(db, user.id, channelId)
  if (!canMoveInto(role, stage)) throw forbidden(`Your role in this channel (${role}) can't move a take to ${STAGE_LABELS[stage]}.`)
  const impossible = whyNot(take, stage)
  if (impossible) throw new HttpError(409, 'impossible-move', impossible)
  await setStage(db, outlineId, stage)
  await recordAudit(db, { channelId, actor: user, kind: 'stage-moved', subject: takeTitle(take), details: { outlineId, from: take.stage, to: stage } })
  if (stage === 'recorded') {
    await notify(db, { channelId, kind: 'take-ready', text: `${takeTitle(take)} is recorded and ready for editing.`, link: takeLink(channelId, outlineId), roles: POST_PRODUCTION, also: take.assignee_id, actorId: user.id })
  }
  return toBoardTake(await existingTake(db, channelId, outlineId))
}

/** The sentence for a move that can't be made, or undefined when it can. */
function whyNot(take: BoardTakeRow, stage: TakeStage): string | undefined {
  if (take.stage === stage) return `This take is at ${STAGE_LABELS[stage]} already.`
  if (stage === 'published') return 'A take becomes Published when it is published as an episode: publish it from the studio.'
  if (take.stage === 'published') return 'This take is published. Unpublish its episode first, then move it.'
  if ((stage === 'recorded' || stage === 'aligned') && !take.has_recording) return `Upload a recording of this take before moving it to ${STAGE_LABELS[stage]}.`
  return undefined
}

/** Sets a take's planned publish day and/or the person on it (a member of the studio team). */
export async function planTake(db: Db, channelId: number, outlineId: number, plan: TakePlan, user: Express.User): Promise<BoardTake> {
  const take = await existingTake(db, channelId, outlineId)
  let assigneeName: string | null | undefined
  if (plan.assigneeId) {
    const person = (await listPeopleWithRoles(db, channelId, STUDIO_TEAM)).find((p) => p.user_id === plan.assigneeId)
    if (!person) {
      throw new HttpError(400, 'invalid-input', "body.assigneeId: that person isn't on this channel's team (owners, presenters and editors)", [
        { path: 'body.assigneeId', message: "that person isn't on this channel's team (owners, presenters and editors)" },
      ])
    }
    assigneeName = person.name
  } else if (plan.assigneeId === null) assigneeName = null
  await setPlan(db, outlineId, { planned_on: plan.plannedOn, assignee_id: plan.assigneeId })
  await recordAudit(db, {
    channelId,
    actor: user,
    kind: 'take-planned',
    subject: takeTitle(take),
    details: { outlineId, ...(plan.plannedOn !== undefined && { plannedOn: plan.plannedOn }), ...(assigneeName !== undefined && { assignee: assigneeName }) },
  })
  return toBoardTake(await existingTake(db, channelId, outlineId))
}

export async function changeCadence(db: Db, channelId: number, { cadenceDays }: CadenceUpdate, user: Express.User): Promise<CadenceUpdate> {
  const before = await findCadence(db, channelId)
  await setCadence(db, channelId, cadenceDays)
  if (before !== cadenceDays) await recordAudit(db, { channelId, actor: user, kind: 'cadence-changed', subject: `every ${cadenceDays} days`, details: { from: before, to: cadenceDays } })
  return { cadenceDays }
}

// ---- moves that follow from other work ------------------------------------------------------------

/** After an upload: the take is recorded (unless further on already), and the team hears of the recording. */
export async function takeRecorded(db: Db, channelId: number, outlineId: number, user: Express.User): Promise<void> {
  const from = await advanceStage(db, outlineId, 'recorded')
  const take = await existingTake(db, channelId, outlineId)
  if (from) await recordAudit(db, { channelId, actor: user, kind: 'stage-moved', subject: takeTitle(take), details: { outlineId, from, to: 'recorded', automatic: 'upload' } })
  await notify(db, { channelId, kind: 'recording-uploaded', text: `${user.name} uploaded a recording of ${takeTitle(take)}.`, link: takeLink(channelId, outlineId), roles: STUDIO_TEAM, also: take.assignee_id, actorId: user.id })
}

/** After an alignment run finished: a recorded take is aligned. */
export async function takeAlignedByRun(db: Db, runId: number): Promise<void> {
  const subject = await findRunTake(db, runId)
  if (!subject) return
  const { channel_id: channelId, outline_id: outlineId } = subject
  const from = await advanceStage(db, outlineId, 'aligned')
  if (!from) return
  const take = await existingTake(db, channelId, outlineId)
  await recordAudit(db, { channelId, actor: null, kind: 'stage-moved', subject: takeTitle(take), details: { outlineId, from, to: 'aligned', automatic: 'alignment' } })
}

/**
 * After publishing: the take is published, planned on its publish day, and (unless `announce` is off, as for
 * demo data) the team hears of it: scheduled, when the day is to come.
 */
export async function takePublished(db: Db, channelId: number, outlineId: number, user: Express.User, episode: { slug: string; publishAt: Date; announce: boolean }): Promise<void> {
  const take = await existingTake(db, channelId, outlineId)
  const publishDay = episode.publishAt.toISOString().slice(0, 10)
  await setStage(db, outlineId, 'published')
  await setPlan(db, outlineId, { planned_on: publishDay })
  const scheduled = episode.publishAt.getTime() > Date.now()
  await recordAudit(db, { channelId, actor: user, kind: 'episode-published', subject: takeTitle(take), details: { outlineId, slug: episode.slug, publishAt: episode.publishAt.toISOString(), from: take.stage } })
  if (!episode.announce) return
  await notify(db, {
    channelId,
    kind: scheduled ? 'episode-scheduled' : 'episode-published',
    text: scheduled ? `${user.name} scheduled ${takeTitle(take)} to appear on ${publishDay}.` : `${user.name} published ${takeTitle(take)}.`,
    link: takeLink(channelId, outlineId),
    roles: STUDIO_TEAM,
    also: take.assignee_id,
    actorId: user.id,
  })
}

/** After unpublishing: the take goes back to Aligned (Rehearsed when it has no recording), its plan kept. */
export async function takeUnpublished(db: Db, channelId: number, outlineId: number, user: Express.User | undefined): Promise<void> {
  const take = await existingTake(db, channelId, outlineId)
  if (take.stage === 'published') await setStage(db, outlineId, take.has_recording ? 'aligned' : 'rehearsed')
  await recordAudit(db, { channelId, actor: user ?? null, kind: 'episode-unpublished', subject: takeTitle(take), details: { outlineId } })
}

