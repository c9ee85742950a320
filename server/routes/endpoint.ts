import type { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import type { Express, Request, RequestHandler, Response } from 'express'
import { z, type ZodType } from 'zod'
import type { Action } from '../../shared/permissions'
import { requireChannelAccess } from '../auth/channel-access'
import type { JwtPassport } from '../auth/passport'
import { signedInUser } from '../auth/signed-in-user'
import type { Db } from '../db/knex'
import { HttpError } from '../errors'
import type { ByteRange } from '../storage'
import type { StoredUpload } from '../uploads/receiver'
import { idParams, parsePart } from '../middleware/validate'

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

/** Who may call an endpoint: anyone, anyone signed in, or channel members whose role allows an action. */
export type Access = Action | 'signed-in' | 'public'

/** One row of an app's endpoint registry. */
export interface EndpointInfo {
  method: Method
  /** the full path, e.g. '/api/channels/:channelId/puzzles' */
  path: string
  access: Access
}

/** A file to download: a handler returns one instead of a JSON body, and it is sent as an attachment. */
export class Download {
  constructor(
    readonly filename: string,
    readonly mimeType: string,
    readonly content: Buffer,
  ) {}
}

/**
 * A JSON reply the caller may hold already. `tag` names the resource's current state (sent as its ETag,
 * with `Cache-Control: private, no-cache` so browsers ask again each time): a request whose If-None-Match
 * holds it is answered 304 and `json` is never called; otherwise `json` gives the body as JSON text.
 */
export class Revalidated {
  constructor(
    readonly tag: string,
    readonly json: () => Promise<string>,
  ) {}
}

/**
 * A stored file played or downloaded in pieces: the whole file (200), or the one byte range the request's
 * Range header asks for (206 with Content-Range; 416 when it lies outside the file), streamed from `open`.
 */
export class Media {
  constructor(
    readonly mimeType: string,
    readonly sizeBytes: number,
    readonly open: (range?: ByteRange) => Promise<Readable>,
  ) {}
}

/**
 * A file shown in place, not downloaded: a picture, a captions track. Express gives it an ETag from its
 * content and answers a request that holds it already with 304.
 */
export class Inline {
  constructor(
    readonly mimeType: string,
    readonly content: Buffer | string,
    readonly cacheControl: string,
  ) {}
}

/** An HTML page with its status (a page that says "not found" is still a page); revalidated by its ETag like Inline. */
export class Page {
  constructor(
    readonly html: string,
    readonly status: 200 | 404 = 200,
  ) {}
}

type Schema = ZodType | undefined
type Parsed<S extends Schema> = S extends ZodType ? z.output<S> : undefined

/** The parameter names of a path: '/a/:aId/b/:bId' → 'aId' | 'bId'. */
type PathParams<P extends string> = P extends `${string}:${infer Name}/${infer Rest}`
  ? Name | PathParams<Rest>
  : P extends `${string}:${infer Name}`
    ? Name
    : never

/** A path's parameters as a handler gets them: `…Id` a number, any other (a link's token) a string. */
type ParamValues<P extends string> = { [K in PathParams<P>]: K extends `${string}Id` ? number : string }

/** An action is decided per channel, so only a path with `:channelId` may name one. */
type SignedInAccess<P extends string> = 'channelId' extends PathParams<P> ? Exclude<Access, 'public'> : 'signed-in'

/** What an endpoint's `upload` hands over: a file, stored or held, let go again when the rest of the request fails its checks. */
interface Received {
  discard: () => Promise<void>
}
/** Receives a multipart request's file (undefined when it carried none); a recording streams into storage, a caption file is held in memory. */
type Receiver<U extends Received> = (req: Request, res: Response) => Promise<U | undefined>

interface Spec<P extends string, Q extends Schema, B extends Schema, U extends Received = StoredUpload> {
  method: Method
  /** below the table's prefix; every `:…Id` param is a numeric id, any other a string (a link's token), checked like the rest of the input */
  path: P
  query?: Q
  body?: B
  /** the status of a reply with a body (201 for a creation, 202 for work queued); a handler that returns nothing answers 204 */
  status?: 200 | 201 | 202
  /** middleware that runs before anything else, e.g. a rate limit */
  before?: RequestHandler[]
  /** a multipart request's file, received once the caller's access and the path's ids are checked; its other fields are the body */
  upload?: Receiver<U>
}

interface SignedInSpec<P extends string, Q extends Schema, B extends Schema, U extends Received> extends Spec<P, Q, B, U> {
  /** 'signed-in', or the action (shared/permissions.ts) the caller's role in `:channelId` must allow */
  access: SignedInAccess<P>
}

interface PublicSpec<P extends string, Q extends Schema, B extends Schema> extends Spec<P, Q, B> {
  /** read the caller's sign-in token when one is sent: the handler gets `user`, undefined for anyone else (a missing, expired or forged token alike) */
  optionalUser?: boolean
}

interface PublicInput<P extends string, Q extends Schema, B extends Schema> {
  params: ParamValues<P>
  query: Parsed<Q>
  body: Parsed<B>
  /** the signed-in caller, on an endpoint with `optionalUser` */
  user?: Express.User
}

interface PageInput<P extends string, Q extends Schema> extends PublicInput<P, Q, undefined> {
  /** the page's own origin as the request names it (`https://host`), for absolute links in its head */
  origin: string
}

interface SignedInInput<P extends string, Q extends Schema, B extends Schema, U> extends PublicInput<P, Q, B> {
  user: Express.User
  /** the received file, for an endpoint with `upload` when the request carried one */
  upload: U | undefined
}

// what the table builds before the signatures of add/addPublic tie it to one endpoint
type LooseSpec = Spec<string, Schema, Schema, Received> & { optionalUser?: boolean }
type LooseInput = PublicInput<string, Schema, Schema>

/** What a handler returns: a JSON body, a Download, a Revalidated reply, Media, or nothing (204). */
type Handler<I> = (input: I) => Promise<unknown>

const registries = new WeakMap<Express, readonly EndpointInfo[]>()

/** Every endpoint added to an app through its endpoint table, in the order they were added. */
export function listEndpoints(app: Express): readonly EndpointInfo[] {
  return registries.get(app) ?? []
}

export type EndpointTable = ReturnType<typeof endpointTable>

/**
 * The one way to add an API route. Each endpoint names its access and its query and body schemas; the
 * handler gets typed, validated `params`, `query`, `body` (and the signed-in `user`) and returns the
 * reply. Checks run in a fixed order: token (401), channel id (400), membership (404), role (403), the
 * rest of the input (400).
 */
export function endpointTable(app: Express, prefix: string, { db, passport }: { db: Db; passport: JwtPassport }) {
  const endpoints: EndpointInfo[] = []
  registries.set(app, endpoints)

  function register(spec: LooseSpec, access: Access, handle: (req: Request, res: Response) => Promise<unknown>, below = prefix): void {
    const path = below + spec.path
    app.route(path)[spec.method](...(spec.before ?? []), async (req, res) => reply(req, res, await handle(req, res), spec.status))
    endpoints.push({ method: spec.method, path, access })
  }

  /** An endpoint for signed-in people; with an action as its access, for channel members whose role allows it. */
  function add<P extends string, Q extends Schema = undefined, B extends Schema = undefined, U extends Received = StoredUpload>(spec: SignedInSpec<P, Q, B, U>, handler: Handler<SignedInInput<P, Q, B, U>>): void
  function add(spec: LooseSpec & { access: Exclude<Access, 'public'> }, handler: Handler<SignedInInput<string, Schema, Schema, Received>>): void {
    const parse = inputParser(spec)
    register(spec, spec.access, async (req, res) => {
      const user = await signedInUser(passport, req, res)
      if (spec.access !== 'signed-in') {
        const { channelId } = parsePart('params', channelParams, req.params)
        await requireChannelAccess(db, user.id, channelId, spec.access)
      }
      if (!spec.upload) return handler({ ...parse(req), user, upload: undefined })
      parse.params(req)
      const upload = await spec.upload(req, res)
      let input
      try {
        input = parse(req)
      } catch (error) {
        await upload?.discard()
        throw error
      }
      return handler({ ...input, user, upload })
    })
  }

  /** An endpoint anyone may call, signed in or not. */
  function addPublic<P extends string, Q extends Schema = undefined, B extends Schema = undefined>(spec: PublicSpec<P, Q, B>, handler: Handler<PublicInput<P, Q, B>>): void
  function addPublic(spec: LooseSpec, handler: Handler<LooseInput>): void {
    const parse = inputParser(spec)
    register(spec, 'public', async (req, res) => handler({ ...parse(req), user: spec.optionalUser ? await optionalUser(passport, req, res) : undefined }))
  }

  /** An HTML page anyone may open, below the site's root rather than the table's prefix; its handler returns a Page. */
  function addPage<P extends string, Q extends Schema = undefined>(spec: PublicSpec<P, Q, undefined>, handler: Handler<PageInput<P, Q>>): void
  function addPage(spec: LooseSpec, handler: Handler<PageInput<string, Schema>>): void {
    const parse = inputParser(spec)
    register(
      spec,
      'public',
      async (req, res) =>
        handler({ ...parse(req), body: undefined, user: spec.optionalUser ? await optionalUser(passport, req, res) : undefined, origin: `${req.protocol}://${req.get('host') ?? 'localhost'}` }),
      '',
    )
  }

  return { add, addPublic, addPage }
}

const channelParams = idParams('channelId')

/** The signed-in caller when the request carries a good token; nobody (not a 401) when it carries none or a bad one. */
async function optionalUser(passport: JwtPassport, req: Request, res: Response): Promise<Express.User | undefined> {
  if (req.headers.authorization === undefined) return undefined
  try {
    return await signedInUser(passport, req, res)
  } catch (error) {
    if (error instanceof HttpError && error.status === 401) return undefined
    throw error
  }
}

const paramNames = (path: string): string[] => [...path.matchAll(/:(\w+)/g)].map(([, name]) => name ?? '')

// a signed link's token: whoever reads it says whether it is good (a bad one is their 404 with a sentence); only its size is checked here
const tokenParam = z.string().max(2048, { message: 'is too long to be a link' })

function inputParser({ path, query, body }: LooseSpec): ((req: Request) => LooseInput) & { params: (req: Request) => unknown } {
  const names = paramNames(path)
  const params = idParams(...names.filter((name) => name.endsWith('Id'))).extend(
    Object.fromEntries(names.filter((name) => !name.endsWith('Id')).map((name) => [name, tokenParam])),
  )
  const parseParams = (req: Request) => parsePart('params', params, req.params)
  return Object.assign(
    (req: Request) => ({
      params: parseParams(req),
      query: query && parsePart('query', query, req.query),
      body: body && parsePart('body', body, req.body),
    }),
    { params: parseParams },
  )
}

async function reply(req: Request, res: Response, result: unknown, status = 200): Promise<void> {
  if (result instanceof Revalidated) {
    res.set({ ETag: result.tag, 'Cache-Control': 'private, no-cache' })
    // req.fresh compares If-None-Match with the ETag just set
    if (req.fresh) res.status(304).end()
    else res.status(status).type('json').send(await result.json())
  } else if (result instanceof Download) res.type(result.mimeType).attachment(result.filename).send(result.content)
  else if (result instanceof Media) await sendMedia(req, res, result)
  else if (result instanceof Inline) res.type(result.mimeType).set('Cache-Control', result.cacheControl).send(result.content)
  else if (result instanceof Page) res.status(result.status).type('html').set('Cache-Control', 'no-cache').send(result.html)
  else if (result === undefined) res.status(204).end()
  else res.status(status).json(result)
}

const MEDIA_HEADERS = {
  'Accept-Ranges': 'bytes',
  // a stored file never changes under its id; only this browser may keep it (an hour), never a shared cache
  'Cache-Control': 'private, max-age=3600',
}

/** Range requests as RFC 9110 §14 has them: one range → 206, none, several or a malformed one → the whole file. */
async function sendMedia(req: Request, res: Response, media: Media): Promise<void> {
  const size = media.sizeBytes
  const ranges = req.headers.range === undefined ? undefined : req.range(size, { combine: true })
  if (ranges === -1) {
    res.set('Content-Range', `bytes */${size}`)
    throw new HttpError(416, 'range-not-satisfiable', `The range asked for lies outside the file, which has ${size} bytes.`)
  }
  const range = Array.isArray(ranges) && ranges.type === 'bytes' && ranges.length === 1 ? ranges[0] : undefined
  res.set(MEDIA_HEADERS).type(media.mimeType)
  if (range) res.status(206).set({ 'Content-Range': `bytes ${range.start}-${range.end}/${size}`, 'Content-Length': String(range.end - range.start + 1) })
  else res.status(200).set('Content-Length', String(size))
  // Express answers HEAD with the GET route: the headers say it all, and the store is not read
  if (req.method === 'HEAD') return void res.end()
  const body = await media.open(range && { start: range.start, end: range.end })
  try {
    await pipeline(body, res)
  } catch (error) {
    // a player that seeks closes its request mid-file all the time: no failure of ours. A store failing
    // mid-file can't become an error reply any more (the status is sent): the cut connection says it.
    if (!req.destroyed) req.log?.warn({ err: error }, 'media stream failed')
    res.destroy()
  }
}
