import type { Role } from '@shared/schemas/auth'

/** The roles as a person picks them, most trusted first, each with what it lets someone do. */
export const ROLE_CHOICES: { value: Role; label: string }[] = [
  { value: 'owner', label: 'Owner: everything, people included' },
  { value: 'presenter', label: 'Presenter: puzzles, takes and rehearsals' },
  { value: 'editor', label: 'Editor: recordings, alignment and publishing' },
  { value: 'viewer', label: 'Viewer: published episodes only' },
]
