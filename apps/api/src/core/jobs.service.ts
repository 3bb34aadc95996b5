import { type BeforeApplicationShutdown, Inject, Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import PgBoss from 'pg-boss';
import type { Executor } from '@hitchbook/db';
import { APP_CONFIG, type AppConfig } from './config.js';
import { jobDbOf } from './jobs.db-adapter.js';

export interface QueueDefinition<T extends object> {
  name: string;
  retryLimit: number;
  /** Seconds before the first retry; later retries back off exponentially. */
  retryDelaySeconds: number;
  /** A job still running after this long is taken as lost and retried. */
  expireInSeconds: number;
  handle(data: T): Promise<void>;
}

/**
 * The job queue, kept in PostgreSQL by pg-boss so that every API instance shares it and a queued job
 * survives a restart. Features register their queues while the modules initialise; the queues are
 * created and the workers started once the application has bootstrapped.
 */
@Injectable()
export class JobsService implements OnApplicationBootstrap, BeforeApplicationShutdown {
  private readonly logger = new Logger('Jobs');
  private readonly boss: PgBoss;
  private readonly queues = new Map<string, QueueDefinition<object>>();

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    this.boss = new PgBoss({
      connectionString: config.databaseUrl,
      schema: config.jobs.schema,
      max: 3,
      application_name: 'hitchbook-jobs',
      schedule: false,
      // Completed jobs can hold e-mail content: archive them soon and drop the archive after a week.
      archiveCompletedAfterSeconds: 60 * 60,
      deleteAfterDays: 7,
    });
    // A database outage surfaces here as well as in requests; pg-boss reconnects by itself.
    this.boss.on('error', (err) => this.logger.warn(`Job queue: ${err.message}`));
  }

  register<T extends object>(queue: QueueDefinition<T>): void {
    if (this.queues.has(queue.name)) throw new Error(`Queue ${queue.name} is registered twice`);
    this.queues.set(queue.name, queue as unknown as QueueDefinition<object>);
  }

  async onApplicationBootstrap(): Promise<void> {
    await this.boss.start();
    for (const queue of this.queues.values()) {
      await this.boss.createQueue(queue.name, { name: queue.name });
      await this.boss.work<object>(queue.name, { batchSize: 1, pollingIntervalSeconds: this.config.jobs.pollingIntervalSeconds }, (jobs) => this.run(queue, jobs));
    }
  }

  async beforeApplicationShutdown(): Promise<void> {
    await this.boss.stop({ graceful: true, wait: true, timeout: 10_000 });
  }

  /**
   * Queues a job; pass the transaction that makes the change the job follows from, so the job exists
   * exactly when that change commits. Retry settings travel with each job, so a changed setting applies
   * to the next job without touching the queue.
   */
  async send<T extends object>(queueName: string, data: T, executor?: Executor): Promise<string> {
    const queue = this.queues.get(queueName);
    if (!queue) throw new Error(`Queue ${queueName} is not registered`);
    const id = await this.boss.send(queueName, data, {
      retryLimit: queue.retryLimit,
      retryDelay: queue.retryDelaySeconds,
      retryBackoff: true,
      expireInSeconds: queue.expireInSeconds,
      ...(executor ? { db: jobDbOf(executor) } : {}),
    });
    // pg-boss answers null, not an error, for a queue that does not exist.
    if (!id) throw new Error(`Queue ${queueName} did not accept the job`);
    return id;
  }

  private async run(queue: QueueDefinition<object>, jobs: PgBoss.Job<object>[]): Promise<void> {
    for (const job of jobs) {
      try {
        await queue.handle(job.data);
      } catch (err) {
        this.logger.warn(`${queue.name} job ${job.id} failed, to be retried: ${err instanceof Error ? err.message : String(err)}`);
        throw err;
      }
    }
  }
}
