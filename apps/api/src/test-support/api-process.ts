import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort } from './free-port.js';
import { waitFor } from './poll.js';

const API_ENTRY = fileURLToPath(new URL('../../dist/main.js', import.meta.url));
const running = new Set<ChildProcess>();

// A test file that dies leaves no API behind it.
process.once('exit', () => {
  for (const child of running) child.kill('SIGKILL');
});

export interface ApiProcessOptions {
  databaseUrl: string;
  /** Extra environment, such as a fault point or a job queue schema of the test's own. */
  env?: Record<string, string>;
  port?: number;
}

/**
 * The built API (apps/api/dist) run as a child process with NODE_ENV=test, so a test can kill it, start
 * it again or run two of them against one database. `npm test` builds it before the tests run.
 */
export class ApiProcess {
  private child: ChildProcess | null = null;
  private output = '';
  private exit: Promise<{ code: number | null; signal: NodeJS.Signals | null }> | null = null;
  readonly uploadDir = mkdtempSync(join(tmpdir(), 'hitchbook-api-process-'));
  port = 0;

  constructor(private readonly options: ApiProcessOptions) {}

  get baseUrl(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  /** The last lines the process wrote, for failure messages. */
  get log(): string {
    return this.output.split('\n').slice(-30).join('\n');
  }

  /** Starts the process (again, after a kill) and resolves once GET /api/health answers 200. */
  async start(env: Record<string, string> = {}): Promise<void> {
    if (this.child) throw new Error('This API process is already running');
    if (!existsSync(API_ENTRY)) throw new Error(`${API_ENTRY} is missing: build the API first (npm run build -w @hitchbook/api)`);
    this.port = this.options.port ?? (this.port || (await freePort()));
    const child = spawn(process.execPath, ['--enable-source-maps', API_ENTRY], {
      env: {
        ...process.env,
        WEB_DIST: '',
        APP_URL: 'http://hitchbook.test',
        UPLOAD_DIR: this.uploadDir,
        ...this.options.env,
        ...env,
        DATABASE_URL: this.options.databaseUrl,
        PORT: String(this.port),
        HOST: '127.0.0.1',
        NODE_ENV: 'test',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    this.child = child;
    running.add(child);
    const collect = (chunk: Buffer) => {
      this.output = (this.output + chunk.toString('utf8')).slice(-20_000);
    };
    child.stdout!.on('data', collect);
    child.stderr!.on('data', collect);
    this.exit = new Promise((resolve) =>
      child.once('exit', (code, signal) => {
        running.delete(child);
        if (this.child === child) this.child = null;
        resolve({ code, signal });
      }),
    );
    try {
      await waitFor(
        `the API on port ${this.port} to answer /api/health`,
        async () => {
          if (!this.child) throw new Error(`the API exited during start-up:\n${this.log}`);
          const res = await fetch(`${this.baseUrl}/api/health`);
          return res.status === 200 ? true : undefined;
        },
        60_000,
        150,
      );
    } catch (err) {
      await this.kill();
      throw err;
    }
  }

  get alive(): boolean {
    return this.child !== null;
  }

  /** Resolves when the process has exited by itself (as a fault point makes it), with how it ended. */
  async exited(timeoutMs = 30_000): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
    if (!this.exit) throw new Error('This API process was never started');
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`the API did not exit within ${timeoutMs} ms`)), timeoutMs);
    });
    try {
      return await Promise.race([this.exit, timeout]);
    } finally {
      clearTimeout(timer);
    }
  }

  /** SIGKILL: no shutdown hooks, no goodbye, as when the machine loses power. */
  async kill(): Promise<void> {
    if (!this.child || !this.exit) return;
    this.child.kill('SIGKILL');
    await this.exit;
  }

  /** Stops the process for good and removes its upload folder. */
  async dispose(): Promise<void> {
    await this.kill();
    rmSync(this.uploadDir, { recursive: true, force: true });
  }

  fetch(path: string, init: RequestInit & { token?: string } = {}): Promise<Response> {
    const { token, headers, ...rest } = init;
    return fetch(`${this.baseUrl}${path}`, {
      ...rest,
      headers: { ...(rest.body ? { 'Content-Type': 'application/json' } : {}), ...(token ? { Authorization: `Bearer ${token}` } : {}), ...(headers as Record<string, string>) },
    });
  }
}
