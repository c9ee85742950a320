import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

/** A mail the catcher received, as a person would read it. */
export interface CaughtMail {
  /** 1, 2, … in the order received */
  id: number
  receivedAt: Date
  from: string
  /** every recipient address, lower case */
  to: string[]
  subject: string
  text: string
  html: string | undefined
}

export interface MailCatcher {
  /** the loopback port it listens on */
  readonly port: number
  /** every mail received so far, oldest first */
  mails(): readonly CaughtMail[]
  /** the next mail received from now on that matches (by default any); rejects after `timeoutMs` */
  nextMail(matches?: (mail: CaughtMail) => boolean, timeoutMs?: number): Promise<CaughtMail>
  /** forgets every mail received so far */
  clear(): void
  close(): Promise<void>
}

/** Only the newest mails are kept: a long development session must not grow the server's memory for ever. */
const KEPT_MAILS = 200
const DEFAULT_WAIT_MS = 5000

/**
 * A fake SMTP server on loopback that keeps what it receives in memory, so development and tests need no
 * mail account: anyone may send to it, without TLS or sign-in.
 */
async function startMailCatcher(port = 0): Promise<MailCatcher> {
  const kept: CaughtMail[] = []
  const waiters = new Set<(mail: CaughtMail) => void>()
  let count = 0

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream).then(
        (parsed) => {
          const mail: CaughtMail = {
            id: ++count,
            receivedAt: new Date(),
            from: parsed.from?.text ?? '',
            to: addressesOf(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : undefined,
          }
          kept.push(mail)
          if (kept.length > KEPT_MAILS) kept.shift()
          for (const waiter of [...waiters]) waiter(mail)
          callback()
        },
        (error: Error) => callback(error),
      )
    },
  })

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject)
      resolve()
    })
  })
  const address = server.server.address() as AddressInfo

  return {
    port: address.port,
    mails: () => [...kept],
    nextMail(matches = () => true, timeoutMs = DEFAULT_WAIT_MS) {
      return new Promise((resolve, reject) => {
        const waiter = (mail: CaughtMail) => {
          if (!matches(mail)) return
          waiters.delete(waiter)
          clearTimeout(timer)
          resolve(mail)
        }
        const timer = setTimeout(() => {
          waiters.delete(waiter)
          reject(new Error(`no matching mail arrived within ${timeoutMs} ms`))
        }, timeoutMs)
        waiters.add(waiter)
      })
    },
    clear: () => void kept.splice(0),
    close: () => new Promise((resolve) => server.close(() => resolve())),
  }
}

type AddressField = Awaited<ReturnType<typeof simpleParser>>['to']

function addressesOf(field: AddressField): string[] {
  const groups = field === undefined ? [] : Array.isArray(field) ? field : [field]
  return groups.flatMap((group) => group.value.flatMap((entry) => (entry.address ? [entry.address.toLowerCase()] : [])))
}

let shared: Promise<MailCatcher> | undefined

/** The process's one catcher, started on first use: the mailer sends to it when no SMTP_URL is set, /dev/mail and tests read it. */
export function sharedMailCatcher(): Promise<MailCatcher> {
  shared ??= startMailCatcher()
  return shared
}
