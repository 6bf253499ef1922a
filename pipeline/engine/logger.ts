import { pino, type Logger } from 'pino';

/**
 * Logs go to stderr: JSON lines when stderr is not a terminal (cron, CI, pipes), readable
 * lines on a terminal (pino-pretty, loaded only then).
 */
export async function createLogger(level: string): Promise<Logger> {
  if (process.stderr.isTTY) {
    const { default: pretty } = await import('pino-pretty');
    return pino({ level }, pretty({ destination: 2, sync: true, ignore: 'pid,hostname', translateTime: 'HH:MM:ss', hideObject: true }));
  }
  return pino({ level, base: { name: 'xsred' } }, pino.destination({ fd: 2, sync: true }));
}
