/**
 * Process entry: configuration from the environment, listen, graceful shutdown on SIGTERM/SIGINT.
 */
import { buildApp } from './app.js';
import { ConfigError, loadConfig } from './config.js';
import { installGracefulShutdown } from './shutdown.js';

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
  installGracefulShutdown(app, { graceMs: config.SHUTDOWN_GRACE_MS });
  await app.listen({ port: config.PORT, host: config.HOST });
}

main().catch((err) => {
  process.stderr.write(`spacetide: failed to start: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
