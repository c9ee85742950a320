import nodemailer, { type Transporter } from 'nodemailer'
import { mailSettings } from '../config'
import { HttpError } from '../errors'
import { sharedMailCatcher } from './catcher'

export interface MailMessage {
  to: string
  subject: string
  text: string
  html?: string
}

let transport: Promise<Transporter> | undefined

/**
 * The one transport, made on first use from SMTP_URL; without one, to the local catcher on loopback
 * (plain SMTP: nothing leaves the machine, so there is nothing to encrypt).
 */
function transportOnce(): Promise<Transporter> {
  transport ??= (async () => {
    const { smtpUrl, from } = mailSettings()
    if (smtpUrl) return nodemailer.createTransport(smtpUrl, { from })
    const catcher = await sharedMailCatcher()
    return nodemailer.createTransport({ host: '127.0.0.1', port: catcher.port, secure: false, ignoreTLS: true }, { from })
  })()
  return transport
}

/** Sends one mail from MAIL_FROM; rejects when the SMTP server refuses it or can't be reached. */
export async function sendMail(message: MailMessage): Promise<void> {
  const sender = await transportOnce()
  await sender.sendMail(message)
}

/**
 * sendMail for a request someone waits on: a mail server that refuses or can't be reached becomes a 502
 * saying what was kept and what to do, not a bare 500.
 */
export async function sendMailOrExplain(message: MailMessage, kept: string): Promise<void> {
  try {
    await sendMail(message)
  } catch {
    throw new HttpError(502, 'mail-not-sent', `${kept}, but the mail to ${message.to} could not be sent. Try again in a moment.`)
  }
}
