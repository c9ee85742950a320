/**
 * A PostgreSQL cluster of one test file's own, for tests that stop and start the database: stopping the
 * shared test cluster would break every other suite. It lives in a temporary folder under /var/tmp (the
 * `postgres` user can enter it, unlike a checkout under /root) on a free loopback port, with durability
 * off, and holds one database migrated and seeded with the demo data. Set-up takes 1–2 s, most of it initdb.
 */
import { execFile } from 'node:child_process'
import { existsSync } from 'node:fs'
import { appendFile, chmod, mkdtemp, readdir, readFile, rm } from 'node:fs/promises'
import { createServer } from 'node:net'
import { join } from 'node:path'
import { promisify } from 'node:util'
import knex from 'knex'
import { knexConfig } from '../../knexfile'
import { seed as seedDemoChannel } from '../../seeds/01_demo_channel'
import { seed as seedDemoPuzzles } from '../../seeds/02_demo_puzzles'

const run = promisify(execFile)

// the project's own clusters: 5434 for npm test, 5444–5455 for benchmarks and parallel checkouts
const isProjectPort = (port: number) => port === 5434 || (port >= 5444 && port <= 5455)
const DATABASE = 'gridcue_own'

export interface OwnPostgres {
  /** the seeded database's address */
  readonly url: string
  /** stops the server at once, as a crash or a maintenance restart would (open connections are cut) */
  stop(): Promise<void>
  /** starts it again on the same port with the same data */
  start(): Promise<void>
  /** freezes every process of the server (SIGSTOP), as a hung machine would: connections stay open, nothing answers */
  freeze(): Promise<void>
  /** lets a frozen server run on (SIGCONT) */
  thaw(): Promise<void>
  /** stops it and removes its folder */
  destroy(): Promise<void>
}

/** Creates, starts, migrates and seeds a cluster of the caller's own; call destroy() when done. */
export async function startOwnPostgres(): Promise<OwnPostgres> {
  const bin = await newestPostgresBin()
  const dir = await mkdtemp('/var/tmp/gridcue-own-pg-')
  const data = join(dir, 'data')
  const port = await freePort()
  const pg = (tool: string, ...args: string[]) => asPostgresUser(join(bin, tool), args)

  const cluster: OwnPostgres = {
    url: `postgres://postgres@127.0.0.1:${port}/${DATABASE}`,
    stop: () => pg('pg_ctl', '-D', data, '-m', 'fast', '-w', 'stop').then(() => undefined),
    start: () => pg('pg_ctl', '-D', data, '-l', join(dir, 'server.log'), '-w', '-t', '30', 'start').then(() => undefined),
    freeze: () => signalServer(data, 'SIGSTOP'),
    thaw: () => signalServer(data, 'SIGCONT'),
    destroy: async () => {
      if (existsSync(join(data, 'postmaster.pid'))) await cluster.stop()
      await rm(dir, { recursive: true, force: true })
    },
  }
  try {
    if (isRoot()) await run('chown', ['postgres:postgres', dir])
    await chmod(dir, 0o700)
    await pg('initdb', '-D', data, '-U', 'postgres', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8', '--no-sync')
    // a throw-away cluster: durability only costs time here
    const settings = [`port = ${port}`, "listen_addresses = '127.0.0.1'", "unix_socket_directories = ''", 'fsync = off', 'synchronous_commit = off', 'full_page_writes = off']
    await appendFile(join(data, 'postgresql.conf'), `\n${settings.join('\n')}\n`)
    await cluster.start()
    await createSeededDatabase(`postgres://postgres@127.0.0.1:${port}/postgres`, cluster.url)
    return cluster
  } catch (error) {
    await cluster.destroy().catch(() => {})
    throw error
  }
}

async function createSeededDatabase(adminUrl: string, url: string): Promise<void> {
  const admin = knex(knexConfig(adminUrl))
  try {
    await admin.raw(`create database ${DATABASE}`)
  } finally {
    await admin.destroy()
  }
  const db = knex(knexConfig(url))
  try {
    await db.migrate.latest()
    await seedDemoChannel(db)
    await seedDemoPuzzles(db)
  } finally {
    await db.destroy()
  }
}

/** Sends `signal` to the server's postmaster (first line of postmaster.pid) and every process it started. */
async function signalServer(data: string, signal: NodeJS.Signals): Promise<void> {
  const postmaster = Number((await readFile(join(data, 'postmaster.pid'), 'utf8')).split('\n')[0])
  const children: number[] = []
  for (const entry of await readdir('/proc')) {
    if (!/^\d+$/.test(entry)) continue
    // /proc/PID/stat: "pid (name) state ppid …" (proc(5)); the name may hold spaces, so read after its ')'
    const stat = await readFile(`/proc/${entry}/stat`, 'utf8').catch(() => '')
    if (Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === postmaster) children.push(Number(entry))
  }
  for (const pid of [postmaster, ...children]) process.kill(pid, signal)
}

const isRoot = () => process.getuid?.() === 0

/** PostgreSQL refuses to run as root, so its tools run as the `postgres` user then (as scripts/lib/setup.sh does). */
async function asPostgresUser(tool: string, args: string[]): Promise<string> {
  const [file, argv] = isRoot() ? ['runuser', ['-u', 'postgres', '--', tool, ...args]] : [tool, args]
  // from / so the tools don't complain about a working folder the postgres user cannot enter
  const { stdout } = await run(file, argv, { cwd: '/' })
  return stdout
}

/** The newest PostgreSQL Debian installed (PG_BIN overrides, as in scripts/lib/setup.sh). */
async function newestPostgresBin(): Promise<string> {
  if (process.env.PG_BIN) return process.env.PG_BIN
  const versions = (await readdir('/usr/lib/postgresql').catch(() => [] as string[]))
    .filter((v) => existsSync(`/usr/lib/postgresql/${v}/bin/initdb`))
    .sort((a, b) => Number(a) - Number(b))
  const newest = versions.at(-1)
  if (!newest) throw new Error('PostgreSQL binaries not found under /usr/lib/postgresql (npm test installs them; or set PG_BIN)')
  return `/usr/lib/postgresql/${newest}/bin`
}

/** A port nothing listens on now, outside the project's own cluster ports. */
async function freePort(): Promise<number> {
  for (;;) {
    const port = await new Promise<number>((resolve, reject) => {
      const probe = createServer()
      probe.once('error', reject)
      probe.listen(0, '127.0.0.1', () => {
        const address = probe.address()
        probe.close(() => resolve(typeof address === 'object' && address ? address.port : 0))
      })
    })
    if (port && !isProjectPort(port)) return port
  }
}
