/**
 * `npm start`: check the configuration, build the client if it is stale, then serve the client, the API
 * and both sockets on PORT. `--api-only` (used by `npm run dev`) skips the client. Stops gracefully on
 * SIGTERM/SIGINT. A bad setting prints one line and exits with status 2.
 */
import { ConfigError, loadConfig, type Config } from './config';
import { createLogger } from './logger';
import { startServer } from './main';
import { ensureClientBuilt } from './client-build';
import { DEFAULT_CLIENT_DIR } from './static';

async function main(): Promise<void> {
  let config: Config;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      process.stderr.write(`matchloom: ${e.message}\n`);
      process.exit(2);
    }
    throw e;
  }
  const logger = createLogger(config);
  const apiOnly = process.argv.includes('--api-only');

  try {
    if (!apiOnly) await ensureClientBuilt(logger);
  } catch (err) {
    logger.error({ err }, 'the client build failed; serving the API only');
  }

  let server: Awaited<ReturnType<typeof startServer>>;
  try {
    server = await startServer(config, { logger, clientDir: apiOnly ? null : DEFAULT_CLIENT_DIR });
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    const reason =
      err.code === 'EADDRINUSE'
        ? `port ${config.port} on ${config.host} is already in use (set PORT to another port)`
        : err.message;
    process.stderr.write(`matchloom: could not start: ${reason}\n`);
    process.exit(1);
  }

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) {
      logger.warn({ signal }, 'second signal: exiting now');
      process.exit(1);
    }
    stopping = true;
    logger.info({ signal }, 'shutting down');
    server.close().then(
      () => process.exit(0),
      (err) => {
        logger.error({ err }, 'shutdown failed');
        process.exit(1);
      },
    );
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

void main();
