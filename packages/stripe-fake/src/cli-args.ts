export interface CliOptions {
  host: string;
  port: number;
  webhookUrl?: string;
  webhookSecret?: string;
  publicUrl?: string;
  secretKey?: string;
  retrySchedule?: number[];
}

export const USAGE = [
  'Usage: hitchbook-stripe-fake [--port PORT] [--host HOST] [--webhook-url URL] [--webhook-secret whsec_…]',
  '                             [--public-url URL] [--secret-key sk_test_…] [--retry-schedule MS,MS,…]',
  '  --port defaults to 12111 (0 picks a free port); without --webhook-secret a random one is made and printed.',
].join('\n');

const FLAGS = ['--host', '--port', '--webhook-url', '--webhook-secret', '--public-url', '--secret-key', '--retry-schedule'] as const;

/** Returns the options, or throws an Error whose message says which flag was wrong and why. */
export function parseCliArgs(argv: string[]): CliOptions {
  const options: CliOptions = { host: '127.0.0.1', port: 12111 };
  for (let i = 0; i < argv.length; i += 2) {
    const flag = argv[i]!;
    const value = argv[i + 1];
    if (!(FLAGS as readonly string[]).includes(flag)) throw new Error(`Unknown option ${flag}`);
    if (value === undefined || value.startsWith('--')) throw new Error(`${flag} needs a value`);
    switch (flag as (typeof FLAGS)[number]) {
      case '--host':
        options.host = value;
        break;
      case '--port':
        options.port = parsePort(value);
        break;
      case '--webhook-url':
        options.webhookUrl = parseUrl(flag, value);
        break;
      case '--webhook-secret':
        options.webhookSecret = value;
        break;
      case '--public-url':
        options.publicUrl = parseUrl(flag, value);
        break;
      case '--secret-key':
        if (!/^sk_test_\w+$/.test(value)) throw new Error(`--secret-key must be a test-mode key (sk_test_…), got "${value}"`);
        options.secretKey = value;
        break;
      case '--retry-schedule':
        options.retrySchedule = parseSchedule(value);
        break;
    }
  }
  return options;
}

function parsePort(value: string): number {
  const port = Number(value);
  if (!/^\d+$/.test(value) || port > 65535) throw new Error(`--port must be a port number from 0 to 65535, got "${value}"`);
  return port;
}

function parseUrl(flag: string, value: string): string {
  if (!/^https?:\/\/\S+$/.test(value)) throw new Error(`${flag} must be an http or https URL, got "${value}"`);
  return value;
}

/** "" means no retries at all; otherwise whole milliseconds separated by commas. */
function parseSchedule(value: string): number[] {
  if (value === '') return [];
  const parts = value.split(',');
  if (!parts.every((p) => /^\d+$/.test(p.trim()))) throw new Error(`--retry-schedule must be whole milliseconds separated by commas, got "${value}"`);
  return parts.map((p) => Number(p.trim()));
}
