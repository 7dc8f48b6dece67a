import { pino, type Logger } from 'pino';
import type { AppConfig } from '../env';

export function createLogger(config: Pick<AppConfig, 'logLevel' | 'nodeEnv'>, options: { pretty?: boolean } = {}): Logger {
  return pino({
    // Readable lines for a person at a terminal (npm start); JSON lines for log collectors.
    ...(options.pretty ? { transport: { target: 'pino-pretty', options: { ignore: 'pid,hostname,app,req,res', singleLine: true } } } : {}),
    level: config.logLevel,
    base: { app: 'tenthmark' },
    redact: { paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'], remove: true },
  });
}
