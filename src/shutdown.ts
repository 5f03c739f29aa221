/**
 * Graceful shutdown: on SIGTERM or SIGINT stop accepting connections, let in-flight requests finish,
 * close the result cache's connections (the cache plugin's onClose), then exit 0. Requests that
 * arrive on a kept-alive connection meanwhile get a 503 problem with Retry-After (protection plugin).
 * If the grace period runs out first, exit 1 so the supervisor knows requests were cut.
 */
import type { FastifyInstance } from 'fastify';

export interface ShutdownOptions {
  /** Time allowed for in-flight requests, ms (SHUTDOWN_GRACE_MS). */
  graceMs: number;
  /** How the process ends; process.exit in service, a spy in tests. */
  exit?: (code: number) => void;
  /** Signals to handle (SIGTERM and SIGINT by default). */
  signals?: NodeJS.Signals[];
}

/**
 * Returns the shutdown function (call it with the reason); installs it on the signals. A second
 * signal while closing is ignored: the grace timer already bounds the wait.
 */
export function installGracefulShutdown(app: FastifyInstance, options: ShutdownOptions): (reason: string) => Promise<void> {
  const exit = options.exit ?? ((code: number) => process.exit(code));
  let closing: Promise<void> | undefined;
  const shutdown = (reason: string): Promise<void> => {
    if (closing) return closing;
    app.log.info({ reason }, 'shutting down: no new connections, finishing in-flight requests');
    const timer = setTimeout(() => {
      app.log.error({ graceMs: options.graceMs }, 'shutdown grace period over; exiting with requests unfinished');
      exit(1);
    }, options.graceMs);
    timer.unref();
    closing = app.close().then(
      () => {
        clearTimeout(timer);
        app.log.info('closed: every in-flight request answered, cache closed');
        exit(0);
      },
      (err: unknown) => {
        clearTimeout(timer);
        app.log.error({ err }, 'error while closing');
        exit(1);
      },
    );
    return closing;
  };
  for (const signal of options.signals ?? ['SIGTERM', 'SIGINT']) process.on(signal, () => void shutdown(signal));
  return shutdown;
}
