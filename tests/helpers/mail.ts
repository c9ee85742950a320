import { sharedMailCatcher, type CaughtMail } from '../../server/mail/catcher'

/** The next mail the local catcher receives for `to` (the app's mailer sends there: tests set no SMTP_URL). */
export async function nextMailTo(to: string): Promise<CaughtMail> {
  const catcher = await sharedMailCatcher()
  return catcher.nextMail((mail) => mail.to.includes(to.toLowerCase()))
}

/** The token of the link in a mail's text whose path starts with `prefix` (e.g. '/invitations/'), and the whole link. */
export function linkIn(mail: CaughtMail, prefix: string): { url: string; token: string } {
  const match = new RegExp(`https?://[^\\s]+${prefix}([A-Za-z0-9_-]+)`).exec(mail.text)
  if (!match) throw new Error(`no ${prefix} link in the mail "${mail.subject}":\n${mail.text}`)
  return { url: match[0], token: match[1]! }
}

/** A password zxcvbn rates strong: four unrelated words (a passphrase, common practice). */
export const STRONG_PASSWORD = 'lantern pebble orchard quiver'
