/**
 * The episode page's HTML: the built `episode.html` with the head tags and a rendition of the episode readable
 * before (or without) JavaScript, and the page's data inlined for the client to start from without a fetch.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import type { EpisodeLine, EpisodePage } from '../../shared/schemas/episode'
import { formatClock } from '../../shared/script/index'
import { cellName } from '../../shared/grid/index'
import { HttpError } from '../errors'
import { pageOrSignIn, pageUrlOf, type EpisodeDeps } from '../services/episodes'
import { escapeHtml as e, scriptJson } from './html'

/** What the page shows: an episode, a members-only one asked for without a sign-in, or nothing at that address. */
type EpisodePageContent = { kind: 'episode'; page: EpisodePage; origin: string } | { kind: 'members'; path: string } | { kind: 'missing' }

const HEAD_MARK = '<!--episode-head-->'
const BODY_MARK = '<!--episode-body-->'

// used when the client is not built (API tests): the same two marks, so the page reads the same
const BUILT_IN_SHELL = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
${HEAD_MARK}
</head>
<body>
<main id="episode">${BODY_MARK}</main>
</body>
</html>
`

/** Reads the built page once it exists (a build may land after the app starts); the built-in shell until then. */
export function episodeShell(clientDir: string): () => string {
  let built: string | undefined
  return () => {
    if (built !== undefined) return built
    try {
      const html = readFileSync(join(clientDir, 'episode.html'), 'utf8')
      if (html.includes(HEAD_MARK) && html.includes(BODY_MARK)) built = html
    } catch {
      // not built: the built-in shell serves
    }
    return built ?? BUILT_IN_SHELL
  }
}

/** The page at an episode's address: 200 with the episode or a sign-in note, 404 (still a page) for nothing there. */
export async function episodePageHtml(
  deps: EpisodeDeps,
  shell: string,
  { channelSlug, episodeSlug, user, origin }: { channelSlug: string; episodeSlug: string; user?: Express.User; origin: string },
): Promise<{ html: string; status: 200 | 404 }> {
  try {
    const page = await pageOrSignIn(deps, channelSlug, episodeSlug, { user })
    const content: EpisodePageContent = page === 'members' ? { kind: 'members', path: pageUrlOf(channelSlug, episodeSlug) } : { kind: 'episode', page, origin }
    return { html: renderEpisodePage(shell, content), status: 200 }
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) return { html: renderEpisodePage(shell, { kind: 'missing' }), status: 404 }
    throw error
  }
}

/** The whole page: the shell with its two marks filled. */
function renderEpisodePage(shell: string, content: EpisodePageContent): string {
  const { head, body } = parts(content)
  // a function as the replacement: a `$` in the episode's text is then text, never a replacement pattern
  return shell.replace(HEAD_MARK, () => head).replace(BODY_MARK, () => body)
}

function parts(content: EpisodePageContent): { head: string; body: string } {
  if (content.kind === 'missing') {
    return {
      head: `<title>No episode here · Gridcue</title>\n<meta name="robots" content="noindex">`,
      body: `<p class="episode-static-note">There is no episode at this address.</p>`,
    }
  }
  if (content.kind === 'members') {
    const signIn = `/sign-in?redirect=${encodeURIComponent(content.path)}`
    return {
      head: `<title>Members only · Gridcue</title>\n<meta name="robots" content="noindex">`,
      body: `<p class="episode-static-note">This episode is for the channel's members only. <a href="${e(signIn)}">Sign in</a> to watch it.</p>`,
    }
  }
  return { head: headOf(content.page, content.origin), body: `${bodyOf(content.page)}\n<script type="application/json" id="episode-data">${scriptJson(content.page)}</script>` }
}

function headOf(page: EpisodePage, origin: string): string {
  const url = origin + pageUrlOf(page.channel.slug, page.episode.slug)
  const description = summaryOf(page)
  const tags: [string, string][] = [
    ['og:type', 'video.episode'],
    ['og:title', page.episode.title],
    ['og:description', description],
    ['og:url', url],
    ['og:site_name', page.channel.name],
    ['og:image', origin + page.pictureUrl],
    ['og:image:width', '1280'],
    ['og:image:height', '720'],
  ]
  return [
    `<title>${e(page.episode.title)} · ${e(page.channel.name)}</title>`,
    `<meta name="description" content="${e(description)}">`,
    `<link rel="canonical" href="${e(url)}">`,
    ...tags.map(([property, value]) => `<meta property="${property}" content="${e(value)}">`),
  ].join('\n')
}

const SUMMARY_MAX = 200

/** The description's first sentence, or a plain summary when it has none. */
function summaryOf(page: EpisodePage): string {
  const first = page.episode.description.trim().split(/(?<=[.!?])\s+|\n/)[0]?.trim()
  if (first) return first.length > SUMMARY_MAX ? `${first.slice(0, SUMMARY_MAX - 1).trimEnd()}…` : first
  const setter = page.puzzle.setter ? ` by ${page.puzzle.setter}` : ''
  return `A step-by-step solve of “${page.puzzle.title}”${setter}, on ${page.channel.name}.`
}

function bodyOf(page: EpisodePage): string {
  const itemOf = new Map(page.lines.map((line, i) => [line.id, i + 1]))
  const puzzle = page.puzzle.link ? `<a href="${e(page.puzzle.link)}">${e(page.puzzle.title)}</a>` : e(page.puzzle.title)
  const setter = page.puzzle.setter ? ` by ${e(page.puzzle.setter)}` : ''
  const watch = page.player.kind === 'none' ? '' : `\n<p><a href="${e(page.player.url)}">Watch the video</a></p>`
  const about = page.episode.description.trim()
    ? `\n<section aria-labelledby="about-heading"><h2 id="about-heading">About this episode</h2>\n${paragraphs(page.episode.description)}</section>`
    : ''
  const estimated = page.timing === 'estimated' ? '\n<p class="episode-static-note">Times are estimated from the script; this episode has no aligned recording yet.</p>' : ''
  return `<article class="episode-static">
<header>
<p class="episode-static-channel">${e(page.channel.name)}</p>
<h1>${e(page.episode.title)}</h1>
<p class="episode-static-credit">Puzzle: ${puzzle}${setter}</p>${watch}
</header>
<section aria-labelledby="rules-heading"><h2 id="rules-heading">Rules</h2>
<p>${e(page.puzzle.rules)}</p></section>${about}
<section aria-labelledby="chapters-heading"><h2 id="chapters-heading">Chapters</h2>
<ol class="episode-static-chapters">
${page.chapters.map((c) => `<li><a href="#step-${itemOf.get(c.lineId) ?? 1}">${timeOf(c.startMs)} ${e(c.title)}</a></li>`).join('\n')}
</ol></section>
<section aria-labelledby="steps-heading"><h2 id="steps-heading">Steps</h2>${estimated}
<ol class="episode-static-steps">
${page.lines.map((line, i) => stepItem(page, line, i + 1)).join('\n')}
</ol></section>
</article>`
}

function stepItem(page: EpisodePage, line: EpisodeLine, n: number): string {
  const placed = line.steps.flatMap((i) => page.steps[i]?.placements ?? []).map((p) => `${cellName(p.cell)} = ${p.digit}`)
  const digits = placed.length > 0 ? `\n<p class="episode-static-placed">${placed.join(', ')}</p>` : ''
  return `<li id="step-${n}">${timeOf(line.startMs)}\n<p>${e(line.text)}</p>${digits}</li>`
}

/** A time on the video: read as m:ss, machine-readable as an ISO 8601 duration. */
function timeOf(ms: number): string {
  const seconds = Math.floor(ms / 1000)
  return `<time datetime="PT${seconds}S">${formatClock(ms)}</time>`
}

function paragraphs(text: string): string {
  return text
    .trim()
    .split(/\n\s*\n/)
    .map((p) => `<p>${p.split('\n').map(e).join('<br>')}</p>`)
    .join('\n')
}
