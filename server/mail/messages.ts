/**
 * The wording of every mail Gridcue sends about people and their accounts: plain text, and the same in
 * simple HTML (one paragraph a line, the link as a button-like anchor). Links are absolute: PUBLIC_URL.
 */
import type { Role } from '../../shared/schemas/auth'
import { escapeHtml } from '../pages/html'
import type { MailMessage } from './mailer'

interface Letter {
  to: string
  subject: string
  /** paragraphs before the link */
  opening: string[]
  link: { url: string; label: string }
  /** paragraphs after it */
  closing: string[]
}

function compose({ to, subject, opening, link, closing }: Letter): MailMessage {
  const text = [...opening, `${link.label}: ${link.url}`, ...closing].join('\n\n')
  const paragraphs = (lines: string[]) => lines.map((line) => `<p>${escapeHtml(line)}</p>`).join('\n')
  const html = [
    '<div style="font-family: sans-serif; line-height: 1.5; max-width: 36em">',
    paragraphs(opening),
    `<p><a href="${escapeHtml(link.url)}" style="display: inline-block; padding: 0.5em 1em; background: #1d4f5e; color: #fff; text-decoration: none; border-radius: 4px">${escapeHtml(link.label)}</a></p>`,
    `<p style="font-size: 0.9em; color: #555">Or paste this address into your browser: ${escapeHtml(link.url)}</p>`,
    paragraphs(closing),
    '</div>',
  ].join('\n')
  return { to, subject, text, html }
}

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (runs the channel and its people)',
  presenter: 'a presenter (enters puzzles, finds paths and writes scripts)',
  editor: 'an editor (edits scripts, aligns recordings and publishes)',
  viewer: 'a viewer (reads what the channel publishes)',
}

export function invitationMail(p: { to: string; channelName: string; inviterName: string | null; role: Role; url: string }): MailMessage {
  const who = p.inviterName ?? 'Someone'
  return compose({
    to: p.to,
    subject: `${who} asks you to join ${p.channelName} on Gridcue`,
    opening: [`Hello,`, `${who} would like you in the channel "${p.channelName}" on Gridcue, as ${ROLE_WORDS[p.role]}.`],
    link: { url: p.url, label: 'Join the channel' },
    closing: ['The link works once and for seven days. If you did not expect this, you can leave this mail be: nothing happens until the link is followed.'],
  })
}

export function passwordResetMail(p: { to: string; name: string; url: string }): MailMessage {
  return compose({
    to: p.to,
    subject: 'Choose a new Gridcue password',
    opening: [`Hello ${p.name},`, 'Someone (we hope you) asked to choose a new password for the Gridcue account of this address.'],
    link: { url: p.url, label: 'Choose a new password' },
    closing: [
      'The link works once and for one hour. Choosing a new password signs the account out everywhere.',
      'If you did not ask for this, ignore this mail: your password stays as it is.',
    ],
  })
}

export function emailConfirmationMail(p: { to: string; name: string; url: string }): MailMessage {
  return compose({
    to: p.to,
    subject: 'Confirm your new address for Gridcue',
    opening: [`Hello ${p.name},`, 'You asked Gridcue to use this address for your account from now on.'],
    link: { url: p.url, label: 'Confirm this address' },
    closing: ['The link works once and for one day. Until it is followed, mail keeps going to your old address.'],
  })
}
