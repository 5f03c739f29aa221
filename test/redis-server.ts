/**
 * A throw-away redis-server for tests: its own process on a free local port, no persistence, stopped
 * (and restartable on the same port) by the test. Needs the redis-server binary (Debian package
 * redis-server; .ci/run installs it).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import * as net from 'node:net';

/** Fails with the way to install redis-server when it is missing (the tests need it: no silent skip). */
export function requireRedisServer(): void {
  const probe = spawnSync('redis-server', ['--version'], { encoding: 'utf8' });
  if (probe.error !== undefined || probe.status !== 0) {
    throw new Error(
      'redis-server not found: the Redis cache tests run a real Redis. Install it with ' +
        '`apt-get install -y redis-server` (Debian package redis-server); .ci/run does so.',
    );
  }
}

/** A free TCP port on 127.0.0.1 (asked of the kernel, then released). */
export async function freePort(): Promise<number> {
  const server = net.createServer();
  server.listen(0, '127.0.0.1');
  await once(server, 'listening');
  const { port } = server.address() as net.AddressInfo;
  server.close();
  await once(server, 'close');
  return port;
}

export class TestRedis {
  private child: ChildProcess | null = null;

  private constructor(readonly port: number) {}

  /** Starts redis-server on a free port and waits until it accepts connections. */
  static async start(): Promise<TestRedis> {
    requireRedisServer();
    const redis = new TestRedis(await freePort());
    await redis.restart();
    return redis;
  }

  get url(): string {
    return `redis://127.0.0.1:${this.port}`;
  }

  /** (Re)starts the server on the same port; resolves once it is ready. */
  async restart(): Promise<void> {
    if (this.child) throw new Error('redis-server already running');
    const child = spawn(
      'redis-server',
      ['--port', String(this.port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--daemonize', 'no', '--loglevel', 'warning'],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    this.child = child;
    let output = '';
    child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
    // Ready when a PING is answered (the log line depends on the log level).
    const deadline = Date.now() + 10_000;
    for (;;) {
      if (child.exitCode !== null) throw new Error(`redis-server exited (${child.exitCode}): ${output}`);
      if (await this.ping()) return;
      if (Date.now() > deadline) throw new Error(`redis-server did not start on port ${this.port}: ${output}`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  /** Kills the server abruptly (SIGKILL: no goodbye to its clients) and waits for it to exit. */
  async kill(): Promise<void> {
    const child = this.child;
    if (!child) return;
    this.child = null;
    if (child.exitCode === null && child.signalCode === null) {
      const exited = once(child, 'exit');
      child.kill('SIGKILL');
      await exited;
    }
  }

  /** Freezes the server (SIGSTOP): connections stay open and nothing answers. */
  pause(): void {
    this.child?.kill('SIGSTOP');
  }

  /** Thaws a paused server (SIGCONT). */
  resume(): void {
    this.child?.kill('SIGCONT');
  }

  /** Sends one raw command and returns the reply text (short replies: inspecting keys from the outside). */
  async command(...args: string[]): Promise<string> {
    const socket = net.connect(this.port, '127.0.0.1');
    await once(socket, 'connect');
    const payload = `*${args.length}\r\n${args.map((a) => `$${Buffer.byteLength(a)}\r\n${a}\r\n`).join('')}`;
    socket.write(payload);
    const [data] = (await once(socket, 'data')) as [Buffer];
    socket.destroy();
    return data.toString();
  }

  private async ping(): Promise<boolean> {
    try {
      return (await Promise.race([this.command('PING'), new Promise<string>((r) => setTimeout(() => r(''), 500))])).startsWith('+PONG');
    } catch {
      return false;
    }
  }
}
