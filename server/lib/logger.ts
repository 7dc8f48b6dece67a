import { pino, type Logger } from 'pino';
import type { AppConfig } from '../env';

export function createLogger(config: Pick<AppConfig, 'logLevel' | 'nodeEnv'>): Logger {
  return pino({
    level: config.logLevel,
    base: { app: 'tenthmark' },
    redact: { paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'], remove: true },
  });
}
