/**
 * Structured logs (pino). Secrets never reach a log line: cookies, authorization headers, set-cookie
 * and any `password` or `token` field are redacted.
 */
import { pino, type DestinationStream, type Logger as PinoLogger } from 'pino';
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

/** A JSON logger to standard output (or `destination`, which tests use to read the lines). */
export function createLogger(
  config: Pick<Config, 'logLevel' | 'nodeEnv'>,
  destination?: DestinationStream,
): Logger {
  const options = {
    level: config.logLevel,
    base: { app: 'matchloom' },
    redact: { paths: REDACT_PATHS, censor: '[redacted]' },
    timestamp: pino.stdTimeFunctions.isoTime,
  };
  return destination ? pino(options, destination) : pino(options);
}
