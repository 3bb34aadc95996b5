import { execFile, execFileSync } from 'node:child_process';
import { appendFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { freePort } from './free-port.js';
import { waitFor } from './poll.js';

const PG_BIN = '/usr/lib/postgresql/15/bin';
const exec = promisify(execFile);
const live = new Set<TempCluster>();

/** initdb and postgres refuse to run as root; as root they run as the Debian postgres user. */
function asServerUser(program: string, args: string[]): [string, string[]] {
  const path = join(PG_BIN, program);
  return process.getuid?.() === 0 ? ['runuser', ['-u', 'postgres', '--', path, ...args]] : [path, args];
}

// A test file that dies does not leave a server running.
process.once('exit', () => {
  for (const cluster of live) cluster.stopNow();
});

/**
 * A throwaway PostgreSQL cluster under the temp folder, on a loopback port of its own, for tests that
 * stop and start the server. Local connections are trusted: it holds nothing but test rows and lives
 * only as long as the test file.
 */
export class TempCluster {
  readonly root: string;
  private readonly data: string;
  private readonly log: string;

  private constructor(readonly port: number) {
    this.root = mkdtempSync(join(tmpdir(), 'hitchbook-pg-'));
    this.data = join(this.root, 'data');
    this.log = join(this.root, 'server.log');
  }

  static async create(): Promise<TempCluster> {
    const cluster = new TempCluster(await freePort());
    live.add(cluster);
    try {
      const sockets = join(cluster.root, 'sock');
      mkdirSync(sockets);
      if (process.getuid?.() === 0) await exec('chown', ['-R', 'postgres:postgres', cluster.root]);
      await exec(...asServerUser('initdb', ['-D', cluster.data, '-U', 'app', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8', '--no-sync']));
      appendFileSync(join(cluster.data, 'postgresql.conf'), `\nlisten_addresses = '127.0.0.1'\nport = ${cluster.port}\nunix_socket_directories = '${sockets}'\n`);
      await cluster.start();
    } catch (err) {
      await cluster.destroy();
      throw err;
    }
    return cluster;
  }

  url(database: string): string {
    return `postgres://app@127.0.0.1:${this.port}/${database}`;
  }

  async createDatabase(name: string): Promise<string> {
    const client = new pg.Client({ connectionString: this.url('postgres') });
    await client.connect();
    try {
      await client.query(`create database ${name}`);
    } finally {
      await client.end();
    }
    return this.url(name);
  }

  /** Starts the server (recovering from the WAL after an immediate stop) and waits until it accepts connections. */
  async start(): Promise<void> {
    // Right after an immediate stop the old server's port and shared memory may still be held for a moment.
    await waitFor(
      'PostgreSQL to start',
      async () => {
        await exec(...asServerUser('pg_ctl', ['-D', this.data, '-l', this.log, '-w', '-t', '60', 'start']));
        return true;
      },
      90_000,
      500,
    );
  }

  /** pg_ctl stop -m immediate: every server process ends at once, with no checkpoint, as in a power cut. */
  async stopImmediately(): Promise<void> {
    await exec(...asServerUser('pg_ctl', ['-D', this.data, '-m', 'immediate', '-w', '-t', '60', 'stop']));
  }

  stopNow(): void {
    try {
      execFileSync(...asServerUser('pg_ctl', ['-D', this.data, '-m', 'immediate', '-w', '-t', '60', 'stop']), { stdio: 'ignore' });
    } catch {
      // Not running.
    }
  }

  async destroy(): Promise<void> {
    this.stopNow();
    live.delete(this);
    rmSync(this.root, { recursive: true, force: true });
  }
}
