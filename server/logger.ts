/**
 * Structured logs (pino). Secrets never reach a log line: cookies, authorization headers, set-cookie
 * and any `password` or `token` field are redacted.
 */
import { pino, type Logger as PinoLogger } from 'pino';
import type { Config } from './config';

export type Logger = PinoLogger;

export const REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'res.headers["set-cookie"]',
  'headers.cookie',
  'headers.authorization',
  'password',
  '*.password',
  'token',
  '*.token',
  'jwtSecret',
  '*.jwtSecret',
];

export function createLogger(config: Pick<Config, 'logLevel' | 'nodeEnv'>): Logger {
  return pino({
    level: config.logLevel,
    base: { app: 'matchloom' },
    redact: { paths: REDACT_PATHS, censor: '[redacted]' },
    timestamp: pino.stdTimeFunctions.isoTime,
  });
}
