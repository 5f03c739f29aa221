/**
 * Two service processes (replicas, each on its own port) sharing one redis-server: a result computed
 * by one is served from Redis by the other (response header x-cache), byte-identical with the same
 * ETag; both keep answering when Redis dies. (Versions kept apart: test/cache/redis.test.ts.)
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort, TestRedis } from '../redis-server.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

interface Replica {
  base: string;
  child: ChildProcess;
  output: () => string;
}

/** Starts `src/server.ts` (through tsx) with the environment given; resolves once it answers. */
async function startReplica(env: Record<string, string>): Promise<Replica> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: ROOT,
    env: { PATH: process.env.PATH ?? '', PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`replica exited: ${output}`);
    if (await fetch(`${base}/`).then((r) => r.ok, () => false)) return { base, child, output: () => output };
    await new Promise((r) => setTimeout(r, 50));
  }
  child.kill('SIGKILL');
  throw new Error(`replica did not answer: ${output}`);
}

async function stopReplica(replica: Replica | undefined): Promise<void> {
  if (!replica || replica.child.exitCode !== null) return;
  const exited = new Promise((r) => replica.child.once('exit', r));
  replica.child.kill('SIGTERM');
  await exited;
}

const sweep = {
  body: { mass: '4.1e6 Msun', spin: 0.6 },
  quantities: ['staticClockRate', 'redshiftToInfinity', 'flowSpeed'],
  axes: [
    { variable: 'r', from: '2 rg', to: '200 rg', count: 120, spacing: 'log' },
    { variable: 'theta', from: '5 deg', to: '175 deg', count: 30 },
  ],
};
const postSweep = (base: string): Promise<Response> =>
  fetch(`${base}/v1/sweep`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(sweep) });

describe('two replicas sharing one Redis', () => {
  let redis: TestRedis;
  const replicas: Replica[] = [];

  beforeAll(async () => {
    redis = await TestRedis.start();
    const env = { REDIS_URL: redis.url, REDIS_KEY_PREFIX: 'replicas-test:' };
    replicas.push(...(await Promise.all([startReplica(env), startReplica(env)])));
  }, 90_000);

  afterAll(async () => {
    await Promise.all(replicas.map(stopReplica));
    await redis?.kill();
  });

  it('a sweep computed by replica A is served from Redis by replica B', async () => {
    const [a, b] = replicas as [Replica, Replica];
    const first = await postSweep(a.base);
    expect(first.status, a.output()).toBe(200);
    expect(first.headers.get('x-cache')).toBe('miss');
    const body = await first.text();
    const second = await postSweep(b.base);
    expect(second.status, b.output()).toBe(200);
    expect(second.headers.get('x-cache')).toBe('hit');
    expect(second.headers.get('etag')).toBe(first.headers.get('etag'));
    expect(await second.text()).toBe(body);
  });

  it('a GET result computed by B is a hit on A', async () => {
    const [a, b] = replicas as [Replica, Replica];
    const url = '/v1/local?mass=10%20Msun&spin=0.9&r=6%20rg';
    const cold = await fetch(b.base + url);
    expect(cold.headers.get('x-cache')).toBe('miss');
    const warm = await fetch(a.base + url);
    expect(warm.headers.get('x-cache')).toBe('hit');
    expect(await warm.text()).toBe(await cold.text());
  });

  it('both replicas keep answering when Redis is killed', async () => {
    await redis.kill();
    try {
      for (const r of replicas) {
        const res = await postSweep(r.base);
        expect(res.status, r.output()).toBe(200);
        expect(res.headers.get('x-cache')).toBe('miss');
      }
    } finally {
      await redis.restart();
    }
  });
});
