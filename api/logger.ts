import { pino, type Logger } from 'pino';

/**
 * The server's logger: JSON lines on stdout (pipe through `pino-pretty` when reading by eye).
 * `destination` replaces stdout, so a test can read what the server would have logged.
 */
export function createLogger(level: string, destination?: NodeJS.WritableStream): Logger {
  const options = { level, base: { app: 'nodewright-api' } };
  return destination ? pino(options, destination) : pino(options);
}
