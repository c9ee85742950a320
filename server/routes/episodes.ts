import { episodeAccessQuerySchema, episodePublishSchema, pictureQuerySchema } from '../../shared/schemas/episode'
import { episodePageHtml, episodeShell } from '../pages/episode-page'
import { episodesOf, episodeCaptionsOf, episodeMediaOf, episodePageOf, episodePictureOf, publishEpisode, takeEpisodeOf, unpublishTake, type EpisodeDeps } from '../services/episodes'
import { Inline, Media, Page, type EndpointTable } from './endpoint'

const take = '/channels/:channelId/outlines/:outlineId/episode'
const address = '/episodes/:channelSlug/:episodeSlug'
const pictureQuery = pictureQuerySchema.extend(episodeAccessQuerySchema.shape)

/** Publishing a take as an episode, and the public episode: its data, files and page. */
export function episodeEndpoints(api: EndpointTable, deps: EpisodeDeps & { clientDir: string }): void {
  const { db } = deps
  api.add({ method: 'get', path: '/channels/:channelId/episodes', access: 'episode.read' }, ({ params, user }) => episodesOf(db, params.channelId, user))
  api.add({ method: 'get', path: take, access: 'outline.read' }, ({ params }) => takeEpisodeOf(db, params.channelId, params.outlineId))
  api.add({ method: 'put', path: take, access: 'episode.publish', body: episodePublishSchema }, ({ params, body, user }) =>
    publishEpisode(db, params.channelId, params.outlineId, body, user),
  )
  api.add({ method: 'delete', path: take, access: 'episode.publish' }, ({ params, user }) => unpublishTake(db, params.channelId, params.outlineId, user))

  // public: a members-only episode answers a signed-in member, or a media element holding the grant the page API gave
  api.addPublic({ method: 'get', path: address, optionalUser: true }, ({ params, user }) => episodePageOf(deps, params.channelSlug, params.episodeSlug, { user }))
  api.addPublic({ method: 'get', path: `${address}/media`, query: episodeAccessQuerySchema, optionalUser: true }, async ({ params, query, user }) => {
    const file = await episodeMediaOf(deps, params.channelSlug, params.episodeSlug, { user, access: query.access })
    return new Media(file.mime, file.sizeBytes, file.open)
  })
  api.addPublic({ method: 'get', path: `${address}/captions.vtt`, query: episodeAccessQuerySchema, optionalUser: true }, async ({ params, query, user }) =>
    new Inline('text/vtt', await episodeCaptionsOf(deps, params.channelSlug, params.episodeSlug, { user, access: query.access }), 'no-cache'),
  )
  api.addPublic({ method: 'get', path: `${address}/picture.png`, query: pictureQuery, optionalUser: true }, async ({ params, query, user }) =>
    new Inline('image/png', await episodePictureOf(deps, params.channelSlug, params.episodeSlug, { user, access: query.access }, query), 'no-cache'),
  )

  const shell = episodeShell(deps.clientDir)
  api.addPage({ method: 'get', path: address, optionalUser: true }, async ({ params, user, origin }) => {
    const { html, status } = await episodePageHtml(deps, shell(), { ...params, user, origin })
    return new Page(html, status)
  })
}
