import type { Express, Request, RequestHandler, Response } from 'express'
import type { z, ZodType } from 'zod'
import type { Action } from '../../shared/permissions'
import { requireChannelAccess } from '../auth/channel-access'
import type { JwtPassport } from '../auth/passport'
import { signedInUser } from '../auth/signed-in-user'
import type { Db } from '../db/knex'
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

type Schema = ZodType | undefined
type Parsed<S extends Schema> = S extends ZodType ? z.output<S> : undefined

/** The parameter names of a path: '/a/:aId/b/:bId' → 'aId' | 'bId'. */
type PathParams<P extends string> = P extends `${string}:${infer Name}/${infer Rest}`
  ? Name | PathParams<Rest>
  : P extends `${string}:${infer Name}`
    ? Name
    : never

/** An action is decided per channel, so only a path with `:channelId` may name one. */
type SignedInAccess<P extends string> = 'channelId' extends PathParams<P> ? Exclude<Access, 'public'> : 'signed-in'

interface Spec<P extends string, Q extends Schema, B extends Schema> {
  method: Method
  /** below the table's prefix; every `:param` is a numeric id, checked like the rest of the input */
  path: P
  query?: Q
  body?: B
  /** the status of a reply with a body (201 for a creation); a handler that returns nothing answers 204 */
  status?: 200 | 201
  /** middleware that runs before anything else, e.g. a rate limit */
  before?: RequestHandler[]
}

interface SignedInSpec<P extends string, Q extends Schema, B extends Schema> extends Spec<P, Q, B> {
  /** 'signed-in', or the action (shared/permissions.ts) the caller's role in `:channelId` must allow */
  access: SignedInAccess<P>
}

interface PublicInput<P extends string, Q extends Schema, B extends Schema> {
  params: Record<PathParams<P>, number>
  query: Parsed<Q>
  body: Parsed<B>
}

interface SignedInInput<P extends string, Q extends Schema, B extends Schema> extends PublicInput<P, Q, B> {
  user: Express.User
}

// what the table builds before the signatures of add/addPublic tie it to one endpoint
type LooseSpec = Spec<string, Schema, Schema>
type LooseInput = PublicInput<string, Schema, Schema>

/** What a handler returns: a JSON body, a Download, a Revalidated reply, or nothing (204). */
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

  function register(spec: LooseSpec, access: Access, handle: (req: Request, res: Response) => Promise<unknown>): void {
    const path = prefix + spec.path
    app.route(path)[spec.method](...(spec.before ?? []), async (req, res) => reply(req, res, await handle(req, res), spec.status))
    endpoints.push({ method: spec.method, path, access })
  }

  /** An endpoint for signed-in people; with an action as its access, for channel members whose role allows it. */
  function add<P extends string, Q extends Schema = undefined, B extends Schema = undefined>(spec: SignedInSpec<P, Q, B>, handler: Handler<SignedInInput<P, Q, B>>): void
  function add(spec: LooseSpec & { access: Exclude<Access, 'public'> }, handler: Handler<SignedInInput<string, Schema, Schema>>): void {
    const parse = inputParser(spec)
    register(spec, spec.access, async (req, res) => {
      const user = await signedInUser(passport, req, res)
      if (spec.access !== 'signed-in') {
        const { channelId } = parsePart('params', channelParams, req.params)
        await requireChannelAccess(db, user.id, channelId, spec.access)
      }
      return handler({ ...parse(req), user })
    })
  }

  /** An endpoint anyone may call, signed in or not. */
  function addPublic<P extends string, Q extends Schema = undefined, B extends Schema = undefined>(spec: Spec<P, Q, B>, handler: Handler<PublicInput<P, Q, B>>): void
  function addPublic(spec: LooseSpec, handler: Handler<LooseInput>): void {
    const parse = inputParser(spec)
    register(spec, 'public', (req) => handler(parse(req)))
  }

  return { add, addPublic }
}

const channelParams = idParams('channelId')

const paramNames = (path: string): string[] => [...path.matchAll(/:(\w+)/g)].map(([, name]) => name ?? '')

function inputParser({ path, query, body }: LooseSpec): (req: Request) => LooseInput {
  const params = idParams(...paramNames(path))
  return (req) => ({
    params: parsePart('params', params, req.params),
    query: query && parsePart('query', query, req.query),
    body: body && parsePart('body', body, req.body),
  })
}

async function reply(req: Request, res: Response, result: unknown, status = 200): Promise<void> {
  if (result instanceof Revalidated) {
    res.set({ ETag: result.tag, 'Cache-Control': 'private, no-cache' })
    // req.fresh compares If-None-Match with the ETag just set
    if (req.fresh) res.status(304).end()
    else res.status(status).type('json').send(await result.json())
  } else if (result instanceof Download) res.type(result.mimeType).attachment(result.filename).send(result.content)
  else if (result === undefined) res.status(204).end()
  else res.status(status).json(result)
}
