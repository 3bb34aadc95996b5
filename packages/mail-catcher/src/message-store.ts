import type { StoredMessage } from './message.js';

/** Keeps the newest messages in memory; the oldest is dropped once the limit is reached. */
export class MessageStore {
  private readonly messages: StoredMessage[] = [];
  private lastId = 0;

  constructor(private readonly limit: number) {
    if (!Number.isInteger(limit) || limit < 1) throw new Error(`Message limit must be a whole number of at least 1, got ${limit}`);
  }

  nextId(): string {
    this.lastId += 1;
    return String(this.lastId);
  }

  add(message: StoredMessage): void {
    this.messages.push(message);
    if (this.messages.length > this.limit) this.messages.splice(0, this.messages.length - this.limit);
  }

  /** Newest first. */
  list(): StoredMessage[] {
    return [...this.messages].reverse();
  }

  get(id: string): StoredMessage | undefined {
    return this.messages.find((m) => m.id === id);
  }

  clear(): void {
    this.messages.length = 0;
  }
}
