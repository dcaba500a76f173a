import { pino, type Logger } from 'pino';

/** The server's logger: JSON lines on stdout (pipe through `pino-pretty` when reading by eye). */
export function createLogger(level: string): Logger {
  return pino({ level, base: { app: 'nodewright-api' } });
}
