import { sharedMailCatcher, type CaughtMail } from '../mail/catcher'
import { escapeHtml } from '../pages/html'
import { Page, type EndpointTable } from './endpoint'

/**
 * /dev/mail: the mails the local catcher received, newest first, links clickable, so a person trying
 * Gridcue without a mail account can follow an invitation or reset link. Only registered when the catcher
 * takes the mail outside production (config.mail.caughtMailPage): its links open other people's accounts.
 */
export function devMailEndpoints(api: EndpointTable): void {
  api.addPage({ method: 'get', path: '/dev/mail' }, async () => new Page(caughtMailPage((await sharedMailCatcher()).mails())))
}

const LINK = /https?:\/\/[^\s<>"']+/g

/** Escaped text with its web addresses as links (found in the raw text, each part escaped on its own). */
function linkified(text: string): string {
  let html = ''
  let from = 0
  for (const match of text.matchAll(LINK)) {
    html += escapeHtml(text.slice(from, match.index)) + `<a href="${escapeHtml(match[0])}">${escapeHtml(match[0])}</a>`
    from = match.index + match[0].length
  }
  return html + escapeHtml(text.slice(from))
}

function mailHtml(mail: CaughtMail): string {
  return `<article>
<h2>${escapeHtml(mail.subject || '(no subject)')}</h2>
<p class="meta">To ${escapeHtml(mail.to.join(', '))} · from ${escapeHtml(mail.from)} · <time datetime="${mail.receivedAt.toISOString()}">${escapeHtml(mail.receivedAt.toISOString().replace('T', ' ').slice(0, 19))} UTC</time></p>
<pre>${linkified(mail.text)}</pre>
</article>`
}

function caughtMailPage(mails: readonly CaughtMail[]): string {
  const body = mails.length ? [...mails].reverse().map(mailHtml).join('\n') : '<p>No mail yet. Invitations, password resets and address confirmations appear here as they are sent.</p>'
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Caught mail · Gridcue</title>
<style>
body { font-family: sans-serif; max-width: 50em; margin: 2em auto; padding: 0 1em; line-height: 1.5 }
article { border-top: 1px solid #ccc; padding: 0.5em 0 }
.meta { color: #555; font-size: 0.9em }
pre { white-space: pre-wrap; font-family: inherit }
</style>
</head>
<body>
<h1>Caught mail</h1>
<p>Gridcue has no mail server configured (SMTP_URL), so what it sends is kept here, in this server's memory, until it stops. Reload for new mail.</p>
${body}
</body>
</html>`
}
