import { chromium, type Browser } from 'playwright-core'

/** Flags Debian's Chromium needs on this closed, GPU-less machine (see the team's stack notes). */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]

/** Debian's Chromium (installed by `npm test` when missing), headless with a fresh profile. */
export const launchChromium = (): Promise<Browser> =>
  chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: CHROMIUM_ARGS })
