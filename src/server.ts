/**
 * Process entry: configuration from the environment, listen, graceful shutdown on SIGTERM/SIGINT.
 */
import { buildApp } from './app.js';
import { ConfigError, loadConfig } from './config.js';

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`spacetide: ${err.message}\n`);
      process.exit(2);
    }
    throw err;
  }
  const app = await buildApp({ config });
  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    app.log.info({ signal }, 'shutting down: no new connections, finishing in-flight requests');
    const timer = setTimeout(() => {
      app.log.error('shutdown grace period over; exiting');
      process.exit(1);
    }, config.SHUTDOWN_GRACE_MS);
    timer.unref();
    app.close().then(
      () => process.exit(0),
      (err) => {
        app.log.error({ err }, 'error while closing');
        process.exit(1);
      },
    );
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
  await app.listen({ port: config.PORT, host: config.HOST });
}

main().catch((err) => {
  process.stderr.write(`spacetide: failed to start: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
