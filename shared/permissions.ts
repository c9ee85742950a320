/**
 * Who may do what in a channel: the one table the server's role check, the router's route meta
 * and the client's `can()` all read. An action is named for what it allows; roles are per channel.
 */
import type { Role } from './schemas/auth'

const everyone = ['owner', 'presenter', 'editor', 'viewer'] as const satisfies readonly Role[]
const studioTeam = ['owner', 'presenter', 'editor'] as const satisfies readonly Role[]
const makers = ['owner', 'presenter'] as const satisfies readonly Role[]
const postProduction = ['owner', 'editor'] as const satisfies readonly Role[]
const ownerOnly = ['owner'] as const satisfies readonly Role[]

export const PERMISSIONS = {
  /** see the channel's name and your own role in it */
  'channel.read': everyone,
  /** rename the channel, change its schedule */
  'channel.manage': ownerOnly,
  /** see who is in the channel */
  'members.read': studioTeam,
  /** invite, remove and change the role of members */
  'members.manage': ownerOnly,
  /** read puzzles and their check results */
  'puzzle.read': studioTeam,
  /** create, edit and delete puzzles */
  'puzzle.edit': makers,
  /** read outlines (path, script, timing) and export them */
  'outline.read': studioTeam,
  /** find a new path (a new take), duplicate or delete a take */
  'outline.create': makers,
  /** edit a take's script, timing and chapters */
  'outline.edit': studioTeam,
  /** play an unpublished recording, its waveform and its alignment runs (recordings show faces and voices: not for viewers) */
  'recording.read': studioTeam,
  /** upload recordings and align a take to them */
  'recording.edit': postProduction,
  /** rehearse a take: timed runs (save, discard) and read-aloud previews */
  'rehearsal.run': makers,
  /** see a take's rehearsal runs and the presenter's calibrated timing */
  'rehearsal.read': studioTeam,
  /** publish and unpublish episodes */
  'episode.publish': postProduction,
  /** read published episodes */
  'episode.read': everyone,
  /** see the pipeline board and the schedule */
  'pipeline.read': studioTeam,
  /** move a take to another stage (STAGE_MOVERS in shared/schemas/pipeline.ts says into which) */
  'pipeline.move': studioTeam,
  /** plan a take's publish day and put a person on it */
  'pipeline.plan': makers,
  /** read the channel's audit log */
  'audit.read': ownerOnly,
} as const satisfies Record<string, readonly Role[]>

export type Action = keyof typeof PERMISSIONS

/** The roles that may perform an action. */
export function rolesFor(action: Action): readonly Role[] {
  return PERMISSIONS[action]
}

/** True when a member with `role` may perform `action`; no role (not a member) may do nothing. */
export function roleCan(role: Role | null | undefined, action: Action): boolean {
  return role != null && (PERMISSIONS[action] as readonly Role[]).includes(role)
}
