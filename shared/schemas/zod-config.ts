/**
 * zod's settings for the whole program; import this module before anything that builds a schema.
 * By default zod probes whether `new Function` works, to compile fast object parsers. Under our
 * content security policy (no 'unsafe-eval') that probe is refused, and the browser files a CSP
 * violation report on every page load. jitless turns the probe and the compiled parsers off, on
 * both sides, so client and server check bodies the same way.
 */
import { z } from 'zod'

z.config({ jitless: true })
