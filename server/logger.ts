import { pino, type Logger } from 'pino'

export type AppLogger = Logger<string>

/** Structured JSON logs; the level comes from config (silent in tests). */
export const createLogger = (level: string): AppLogger => pino<string>({ level })
