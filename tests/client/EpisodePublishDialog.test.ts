import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Role } from '@shared/schemas/auth'
import type { Episode, EpisodePublish } from '@shared/schemas/episode'
import { toDescription } from '@shared/script'
import App from '@/App.vue'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, recordingFixture, saveSession, sessionFixture } from './support'

const TAKE = '/channels/12/outlines/31'
const EPISODE = `${TAKE}/episode`

const recording = recordingFixture()

/** The episode the server answers for what was sent, live from now. */
function episodeFrom(body: EpisodePublish, overrides: Partial<Episode> = {}): Episode {
  return {
    id: 3,
    outlineId: 31,
    slug: body.slug,
    title: body.title,
    visibility: body.visibility,
    state: 'live',
    publishAt: '2026-12-01T10:00:00.000Z',
    pageUrl: `/episodes/channel-12/${body.slug}`,
    puzzleTitle: 'Grid 01',
    description: body.description,
    video: body.video,
    publishedAt: '2026-12-01T10:00:00.000Z',
    publishedBy: 'Ada Lane',
    takeChangedSince: false,
    ...overrides,
  }
}

/** Signs in to channel 12 as `role`, with the take, its one recording and `episode` (null: never published). */
function serve(role: Role, episode: Episode | null) {
  const doc = outlineFor('PE01')
  saveSession()
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, role)] })),
    http.get(apiPath(TAKE), () => HttpResponse.json(recordFor(doc))),
    http.get(apiPath(`${TAKE}/recordings`), () => HttpResponse.json([recording])),
    http.get(apiPath(EPISODE), () =>
      episode ? HttpResponse.json(episode) : HttpResponse.json({ code: 'not-found', message: 'This take has no episode.' }, { status: 404 }),
    ),
  )
  return doc
}

/** Answers PUT …/episode with `answer` and keeps each body sent. */
function answerPublish(answer: (body: EpisodePublish) => Response) {
  const sent: EpisodePublish[] = []
  api.use(
    http.put(apiPath(EPISODE), async ({ request }) => {
      const body = (await request.json()) as EpisodePublish
      sent.push(body)
      return answer(body)
    }),
  )
  return sent
}

async function openDialog() {
  await renderAt(App, TAKE)
  await screen.findByRole('region', { name: 'Replay' })
  await user().click(screen.getByRole('button', { name: 'Publish' }))
  const dialog = await screen.findByRole('dialog', { name: 'Publish this take as an episode' })
  await within(dialog).findByRole('textbox', { name: 'Title' })
  return within(dialog)
}

const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

describe('EpisodePublishDialog', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ shouldAdvanceTime: true })
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('should fill a first publish from the take, follow the title with the address, and publish what is on screen', async () => {
    const doc = serve('editor', null)
    const sent = answerPublish((body) => HttpResponse.json(episodeFrom(body)))
    const dialog = await openDialog()

    expect(dialog.getByRole('textbox', { name: 'Title' })).toHaveValue(doc.title)
    expect(dialog.getByRole('textbox', { name: 'Description' })).toHaveValue(toDescription(doc))
    expect(dialog.getByRole('radio', { name: /The take's recording \(take-one\.webm\)/ })).toBeChecked()
    expect(dialog.getByRole('radio', { name: 'Now' })).toBeChecked()

    const title = dialog.getByRole('textbox', { name: 'Title' })
    await user().clear(title)
    await user().type(title, 'Grid Ö1: the Long Way Round!')
    const slug = dialog.getByRole('textbox', { name: 'Address name' })
    expect(slug).toHaveValue('grid-o1-the-long-way-round')
    expect(slug).toHaveAccessibleDescription(`The page's address: ${location.origin}/episodes/channel-12/grid-o1-the-long-way-round`)

    // once typed by hand, the address name stays as typed
    await user().clear(slug)
    await user().type(slug, 'long-way-round')
    await user().type(title, ' Again')
    expect(slug).toHaveValue('long-way-round')
    await user().click(dialog.getByRole('radio', { name: 'Channel members only' }))
    await user().click(dialog.getByRole('button', { name: 'Publish' }))

    expect(await dialog.findByText('Live')).toBeInTheDocument()
    expect(sent).toEqual([
      {
        slug: 'long-way-round',
        title: 'Grid Ö1: the Long Way Round! Again',
        visibility: 'members',
        description: toDescription(doc),
        video: { kind: 'recording', recordingId: 5 },
      },
    ])
    expect(dialog.getByRole('link', { name: 'Open the episode page' })).toHaveAttribute('href', '/episodes/channel-12/long-way-round')
    expect(dialog.getByRole('button', { name: 'Republish' })).toBeInTheDocument()
  })

  it('should show a taken address name at its field and keep everything typed', async () => {
    serve('owner', null)
    const message = 'Another episode of this channel already uses the address name "grid-01".'
    const sent = answerPublish(() => HttpResponse.json({ code: 'slug-taken', message }, { status: 409 }))
    const dialog = await openDialog()

    const slug = dialog.getByRole('textbox', { name: 'Address name' })
    await user().clear(slug)
    await user().type(slug, 'grid-01')
    await user().clear(dialog.getByRole('textbox', { name: 'Description' }))
    await user().type(dialog.getByRole('textbox', { name: 'Description' }), 'A calm one.')
    await user().click(dialog.getByRole('button', { name: 'Publish' }))

    expect(await dialog.findByText(message)).toBeInTheDocument()
    expect(sent).toHaveLength(1)
    expect(slug).toHaveAttribute('aria-invalid', 'true')
    expect(slug).toHaveAccessibleDescription(expect.stringContaining(message))
    expect(slug).toHaveValue('grid-01')
    expect(dialog.getByRole('textbox', { name: 'Description' })).toHaveValue('A calm one.')
    expect(dialog.getByRole('button', { name: 'Publish' })).toBeInTheDocument()
  })

  it('should refuse a video address that is not a web address, and a schedule without its date, at their fields without asking the server', async () => {
    serve('editor', null)
    const sent = answerPublish((body) => HttpResponse.json(episodeFrom(body)))
    const dialog = await openDialog()

    await user().click(dialog.getByRole('radio', { name: "A video address of the channel's" }))
    await user().type(dialog.getByRole('textbox', { name: 'Video address' }), 'javascript:alert(1)')
    await user().click(dialog.getByRole('button', { name: 'Publish' }))

    expect(dialog.getByRole('textbox', { name: 'Video address' })).toHaveAccessibleDescription(
      expect.stringContaining('Video address must be a web address (https://…).'),
    )

    await user().click(dialog.getByRole('radio', { name: 'At a date and time' }))
    await user().click(dialog.getByRole('button', { name: 'Publish' }))
    expect(dialog.getByRole('combobox', { name: 'Appears on' })).toHaveAccessibleDescription('Choose the date and time the episode appears.')
    expect(sent).toHaveLength(0)
  })

  it('should say the take changed since publishing, and unpublish only once confirmed', async () => {
    const published = episodeFrom(
      { slug: 'grid-01', title: 'Grid 01', visibility: 'public', description: 'Old words.', video: { kind: 'none' } },
      { takeChangedSince: true },
    )
    serve('editor', published)
    let deletes = 0
    api.use(
      http.delete(apiPath(EPISODE), () => {
        deletes++
        return HttpResponse.json({ ...published, state: 'unpublished' })
      }),
    )
    const dialog = await openDialog()

    expect(dialog.getByText('The take has changed since it was published', { exact: false })).toBeInTheDocument()
    expect(dialog.getByRole('textbox', { name: 'Description' })).toHaveValue('Old words.')
    expect(dialog.getByRole('radio', { name: 'No video yet' })).toBeChecked()
    expect(dialog.getByRole('button', { name: 'Republish' })).toBeInTheDocument()

    await user().click(dialog.getByRole('button', { name: 'Unpublish' }))
    const confirm = dialog.getByRole('group', { name: 'Confirm unpublishing' })
    expect(deletes).toBe(0)
    await user().click(within(confirm).getByRole('button', { name: 'Keep it up' }))
    expect(deletes).toBe(0)

    await user().click(dialog.getByRole('button', { name: 'Unpublish' }))
    await user().click(within(dialog.getByRole('group', { name: 'Confirm unpublishing' })).getByRole('button', { name: 'Unpublish' }))
    expect(await dialog.findByText('Unpublished')).toBeInTheDocument()
    expect(deletes).toBe(1)
    expect(dialog.queryByRole('link', { name: 'Open the episode page' })).not.toBeInTheDocument()
    expect(dialog.queryByRole('button', { name: 'Unpublish' })).not.toBeInTheDocument()
  })

  it('should not offer publishing to a presenter', async () => {
    serve('presenter', null)
    await renderAt(App, TAKE)
    await screen.findByRole('region', { name: 'Replay' })

    expect(screen.queryByRole('button', { name: 'Publish' })).not.toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Export' })).toBeInTheDocument()
  })
})
