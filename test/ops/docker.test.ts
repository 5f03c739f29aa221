/**
 * The container files, checked without a container engine: the Dockerfile's stages, user, health
 * check and start command; the image's layout rebuilt in a temporary folder (build output, OpenAPI
 * document, package.json) and started with the image's command; and docker/compose.yaml: two or more
 * replicas behind the load balancer, sharing one Redis.
 */
import { execFileSync, spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse as parseYaml } from 'yaml';
import { freePort } from '../redis-server.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const read = (path: string): string => readFileSync(join(ROOT, path), 'utf8');

interface Instruction {
  op: string;
  args: string;
}

/** Dockerfile instructions per stage: comments dropped, continuation lines joined. */
function parseDockerfile(text: string): Array<{ from: string; name: string | undefined; steps: Instruction[] }> {
  const logical = text
    .replace(/\\\n/g, ' ')
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '' && !l.startsWith('#'));
  const stages: Array<{ from: string; name: string | undefined; steps: Instruction[] }> = [];
  for (const line of logical) {
    const [op = '', ...rest] = line.split(/\s+/);
    const args = rest.join(' ');
    if (op.toUpperCase() === 'FROM') {
      const m = /^(\S+)(?:\s+AS\s+(\S+))?$/i.exec(args);
      stages.push({ from: m?.[1] ?? args, name: m?.[2], steps: [] });
    } else {
      stages.at(-1)?.steps.push({ op: op.toUpperCase(), args });
    }
  }
  return stages;
}

/** The JSON-array (exec) form of CMD/HEALTHCHECK CMD. */
function execForm(args: string): string[] {
  return JSON.parse(args.slice(args.indexOf('['))) as string[];
}

const stages = parseDockerfile(read('docker/Dockerfile'));
const runtime = stages.at(-1)!;
const build = stages.find((s) => s.name === 'build')!;
const stepsOf = (stage: typeof runtime, op: string): Instruction[] => stage.steps.filter((s) => s.op === op);

describe('docker/Dockerfile', () => {
  it('builds in one stage and runs from another with production dependencies only', () => {
    expect(stages.length).toBeGreaterThanOrEqual(2);
    expect(stepsOf(build, 'RUN').map((s) => s.args)).toContain('npm run build');
    const installs = stepsOf(runtime, 'RUN').map((s) => s.args);
    expect(installs.some((a) => /npm ci .*--omit=dev/.test(a))).toBe(true);
    expect(stepsOf(runtime, 'ENV').some((s) => /NODE_ENV=production/.test(s.args))).toBe(true);
  });

  it('runs as a user other than root', () => {
    const users = stepsOf(runtime, 'USER');
    expect(users.length).toBeGreaterThan(0);
    expect(['root', '0', '0:0']).not.toContain(users.at(-1)!.args);
  });

  it('copies sources that exist (and are not excluded by .dockerignore)', () => {
    const ignored = read('.dockerignore').split('\n').map((l) => l.trim()).filter(Boolean);
    for (const stage of stages) {
      for (const copy of stepsOf(stage, 'COPY')) {
        if (copy.args.startsWith('--from=')) continue;
        const parts = copy.args.split(/\s+/);
        for (const source of parts.slice(0, -1)) {
          expect(existsSync(join(ROOT, source)), `${source} exists`).toBe(true);
          expect(ignored, `${source} not in .dockerignore`).not.toContain(source);
        }
      }
    }
    // The runtime stage copies the build stage's output folder, which `npm run build` writes.
    const fromBuild = stepsOf(runtime, 'COPY').filter((c) => c.args.startsWith('--from=build'));
    expect(fromBuild.map((c) => c.args)).toContain('--from=build /app/dist ./dist');
    expect(JSON.parse(read('tsconfig.json')).compilerOptions.outDir).toBe('dist');
  });

  it('has a HEALTHCHECK on GET /healthz, and starts with node dist/src/server.js', () => {
    const health = stepsOf(runtime, 'HEALTHCHECK');
    expect(health).toHaveLength(1);
    expect(health[0]!.args).toMatch(/--timeout=\d+s/);
    expect(healthPath()).toBe('/healthz');
    expect(execForm(stepsOf(runtime, 'CMD').at(-1)!.args)).toEqual(['node', 'dist/src/server.js']);
  });
});

/** The path the HEALTHCHECK command fetches. */
function healthPath(): string {
  const command = execForm(stepsOf(runtime, 'HEALTHCHECK')[0]!.args).join(' ');
  const m = /\+ '(\/[^']*)'/.exec(command);
  if (!m?.[1]) throw new Error(`no path in HEALTHCHECK: ${command}`);
  return m[1];
}

describe('the image layout, built and started as the Dockerfile does', () => {
  let work: string;
  let app: string;
  let server: ChildProcess | undefined;

  beforeAll(() => {
    work = mkdtempSync(join(tmpdir(), 'spacetide-image-'));
    // Build stage: package files, tsconfig files and src, then `npm run build` (tsc).
    const buildDir = join(work, 'build');
    for (const f of ['package.json', 'package-lock.json', 'tsconfig.json', 'tsconfig.build.json', 'src']) cpSync(join(ROOT, f), join(buildDir, f), { recursive: true });
    symlinkSync(join(ROOT, 'node_modules'), join(buildDir, 'node_modules'), 'dir');
    execFileSync(process.execPath, [join(ROOT, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.build.json'], { cwd: buildDir, stdio: 'pipe' });
    // Runtime stage: package files, the build output and the OpenAPI document; nothing of src/ or test/.
    app = join(work, 'app');
    for (const f of ['package.json', 'package-lock.json', 'openapi']) cpSync(join(ROOT, f), join(app, f), { recursive: true });
    cpSync(join(buildDir, 'dist'), join(app, 'dist'), { recursive: true });
    symlinkSync(join(ROOT, 'node_modules'), join(app, 'node_modules'), 'dir');
  }, 120_000);

  afterAll(() => {
    server?.kill('SIGKILL');
    server = undefined;
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('the build output holds the start file, and imports only production dependencies and node built-ins', () => {
    expect(existsSync(join(app, 'dist/src/server.js'))).toBe(true);
    const pkg = JSON.parse(read('package.json')) as { dependencies: Record<string, string> };
    const allowed = new Set([...Object.keys(pkg.dependencies), ...builtinModules]);
    const imported = new Set<string>();
    const walk = (dir: string): void => {
      for (const name of readdirSync(dir)) {
        const p = join(dir, name);
        if (statSync(p).isDirectory()) walk(p);
        else if (p.endsWith('.js')) {
          for (const m of readFileSync(p, 'utf8').matchAll(/(?:from\s+|import\s*\(\s*|import\s+)['"]([^'"./][^'"]*)['"]/g)) {
            const spec = m[1]!.replace(/^node:/, '');
            imported.add(spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : spec.split('/')[0]!);
          }
        }
      }
    };
    walk(join(app, 'dist'));
    expect(imported.size).toBeGreaterThan(3);
    for (const name of imported) expect(allowed.has(name), `${name} is a production dependency`).toBe(true);
  });

  /** Starts the image's CMD in the runtime layout on a free port; resolves once GET / answers. */
  async function start(): Promise<{ base: string; port: number; output: () => string }> {
    const port = await freePort();
    const [command, ...args] = execForm(stepsOf(runtime, 'CMD').at(-1)!.args);
    expect(command).toBe('node');
    server = spawn(process.execPath, args, {
      cwd: app,
      env: { PATH: process.env.PATH ?? '', NODE_ENV: 'production', PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'warn' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    server.stdout?.on('data', (d: Buffer) => (output += d.toString()));
    server.stderr?.on('data', (d: Buffer) => (output += d.toString()));
    const base = `http://127.0.0.1:${port}`;
    for (let i = 0; i < 400; i++) {
      if (server.exitCode !== null) throw new Error(`server exited: ${output}`);
      const root = await fetch(`${base}/`).catch(() => undefined);
      if (root !== undefined) {
        expect(root.status, output).toBe(200);
        return { base, port, output: () => output };
      }
      await new Promise((r) => setTimeout(r, 50));
    }
    throw new Error(`server did not answer: ${output}`);
  }

  async function stop(): Promise<number | null> {
    const child = server;
    server = undefined;
    if (!child || child.exitCode !== null) return child?.exitCode ?? null;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill('SIGTERM');
    await exited;
    return child.exitCode;
  }

  it('`node dist/src/server.js` starts and answers, with the OpenAPI document found, and stops on SIGTERM', async () => {
    const { base, output } = await start();
    expect((await fetch(`${base}/openapi.json`)).status).toBe(200);
    expect((await fetch(`${base}/v1/spacetime?mass=10%20Msun&spin=0.5`)).status).toBe(200);
    expect(await stop(), output()).toBe(0);
  });

  // /healthz is registered by the health plugin (src/plugins/health.ts).
  it('the HEALTHCHECK command itself succeeds against the started server', async () => {
    const { port, output } = await start();
    const [command, ...args] = execForm(stepsOf(runtime, 'HEALTHCHECK')[0]!.args); // the JSON array after CMD
    expect(command).toBe('node');
    const result = spawnSync(process.execPath, args, { env: { PORT: String(port) }, encoding: 'utf8', timeout: 10_000 });
    expect(result.status, result.stderr + output()).toBe(0);
    await stop();
  });
});

describe('docker/compose.yaml', () => {
  const compose = parseYaml(read('docker/compose.yaml')) as {
    services: Record<string, {
      image?: string;
      build?: { context: string; dockerfile: string };
      environment?: Record<string, string>;
      deploy?: { replicas?: number };
      depends_on?: Record<string, { condition: string }>;
      healthcheck?: { test: string[] };
      ports?: string[];
      volumes?: string[];
      command?: string[];
    }>;
  };
  const services = compose.services;
  const api = Object.entries(services).find(([, s]) => s.build?.dockerfile === 'docker/Dockerfile');

  it('runs the service image with two or more replicas', () => {
    expect(api, 'a service built from docker/Dockerfile').toBeDefined();
    const [, svc] = api!;
    expect(svc.build!.context).toBe('..');
    expect(svc.deploy?.replicas ?? 1).toBeGreaterThanOrEqual(2);
  });

  it('points every replica at one Redis service with a health check, started before them', () => {
    const [, svc] = api!;
    const url = new URL(svc.environment!.REDIS_URL!);
    expect(url.protocol).toBe('redis:');
    const redis = services[url.hostname];
    expect(redis, `service ${url.hostname}`).toBeDefined();
    expect(redis!.image).toMatch(/^redis:/);
    expect(redis!.deploy?.replicas ?? 1).toBe(1);
    expect(redis!.healthcheck?.test.join(' ')).toMatch(/redis-cli ping/);
    expect(svc.depends_on?.[url.hostname]?.condition).toBe('service_healthy');
    // A cache, not a database: no snapshots, no append-only file, bounded memory.
    expect(redis!.command?.join(' ')).toMatch(/--save\s+--appendonly no.*--maxmemory-policy allkeys-lru/);
  });

  it('puts a load balancer in front whose upstream is the replicated service on its port', () => {
    const [name, svc] = api!;
    const lb = Object.values(services).find((s) => s.depends_on?.[name]?.condition === 'service_healthy' && s.ports?.length);
    expect(lb, 'a published service that waits for healthy replicas').toBeDefined();
    const mount = lb!.volumes!.map((v) => v.split(':')).find(([, target]) => target?.startsWith('/etc/nginx/'));
    expect(mount).toBeDefined();
    const conf = read(join('docker', mount![0]!));
    const upstream = /upstream\s+(\S+)\s*\{([^}]*)\}/.exec(conf);
    expect(upstream).not.toBeNull();
    const servers = [...upstream![2]!.matchAll(/^\s*server\s+(\S+)/gm)].map((m) => m[1]);
    expect(servers).toEqual([`${name}:${svc.environment!.PORT}`]);
    // Docker's DNS lists every replica of the service; `resolve` keeps the list current.
    expect(upstream![2]).toMatch(/resolve/);
    expect(conf).toMatch(/resolver 127\.0\.0\.11/);
    expect(conf).toMatch(new RegExp(`proxy_pass http://${upstream![1]};`));
  });
});
