/**
 * The service as a real process for the operations tests: `node --import tsx src/server.ts` on an
 * ephemeral port of 127.0.0.1, its JSON log lines collected, its resident memory read from /proc,
 * always killed at the end (also when a test fails).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const START_TIMEOUT_MS = 90_000;

export interface ServiceProcess {
  /** http://127.0.0.1:<port> */
  url: string;
  port: number;
  child: ChildProcess;
  /** Every JSON log line so far. */
  lines: Record<string, unknown>[];
  /** Resolves with the exit code and signal once the process has exited. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** Resident set size now, bytes (Linux /proc; undefined elsewhere or after exit). */
  rssBytes(): number | undefined;
  /** SIGKILL if still running. */
  kill(): void;
}

/** A port the OS reports free on 127.0.0.1 (closed again before the service binds it). */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => (port > 0 ? resolve(port) : reject(new Error('no free port'))));
    });
  });
}

/** Starts the service with `env` over the current environment; resolves once /healthz answers. */
export async function startService(env: Record<string, string>): Promise<ServiceProcess> {
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: ROOT,
    env: { ...process.env, HOST: '127.0.0.1', LOG_LEVEL: 'info', ...env, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const lines: Record<string, unknown>[] = [];
  let stderr = '';
  let pending = '';
  child.stdout?.on('data', (chunk: Buffer) => {
    pending += chunk.toString('utf8');
    const parts = pending.split('\n');
    pending = parts.pop() ?? '';
    for (const part of parts) {
      if (!part.trim()) continue;
      try {
        lines.push(JSON.parse(part) as Record<string, unknown>);
      } catch {
        stderr += `${part}\n`;
      }
    }
  });
  child.stderr?.on('data', (chunk: Buffer) => {
    stderr = (stderr + chunk.toString('utf8')).slice(-4000);
  });
  let exitedAlready = false;
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => {
    child.once('exit', (code, signal) => {
      exitedAlready = true;
      resolve({ code, signal });
    });
  });
  const kill = () => {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  };
  const deadline = Date.now() + START_TIMEOUT_MS;
  for (;;) {
    if (exitedAlready) throw new Error(`the service exited before answering /healthz:\n${stderr}`);
    if (Date.now() > deadline) {
      kill();
      throw new Error(`the service did not answer /healthz within ${START_TIMEOUT_MS} ms:\n${stderr}`);
    }
    try {
      const res = await fetch(`${url}/healthz`, { signal: AbortSignal.timeout(2000) });
      if (res.status === 200) break;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    url,
    port,
    child,
    lines,
    exited,
    kill,
    rssBytes() {
      try {
        const status = readFileSync(`/proc/${child.pid}/status`, 'utf8');
        const kb = /^VmRSS:\s+(\d+)\s+kB$/m.exec(status);
        return kb ? Number(kb[1]) * 1024 : undefined;
      } catch {
        return undefined;
      }
    },
  };
}

/** The value of one series in a Prometheus text exposition, or undefined. */
export function sample(text: string, series: string): number | undefined {
  for (const line of text.split('\n')) {
    if (line.startsWith(`${series} `)) return Number(line.slice(series.length + 1));
  }
  return undefined;
}
