import { describe, expect, it } from 'vitest';
import { parseCliArgs } from './cli-args.js';

describe('parseCliArgs', () => {
  it('listens on loopback port 12111 when given no flags', () => {
    expect(parseCliArgs([])).toEqual({ host: '127.0.0.1', port: 12111 });
  });

  it('reads every flag', () => {
    expect(
      parseCliArgs([
        '--port', '0',
        '--host', '0.0.0.0',
        '--webhook-url', 'http://127.0.0.1:3000/api/payments/stripe-webhook',
        '--webhook-secret', 'whsec_abc',
        '--public-url', 'http://localhost:12111',
        '--secret-key', 'sk_test_hitchbook_local',
        '--retry-schedule', '100, 200,400',
      ]),
    ).toEqual({
      host: '0.0.0.0',
      port: 0,
      webhookUrl: 'http://127.0.0.1:3000/api/payments/stripe-webhook',
      webhookSecret: 'whsec_abc',
      publicUrl: 'http://localhost:12111',
      secretKey: 'sk_test_hitchbook_local',
      retrySchedule: [100, 200, 400],
    });
    expect(parseCliArgs(['--retry-schedule', '']).retrySchedule).toEqual([]);
  });

  it('names the flag when its value is wrong', () => {
    expect(() => parseCliArgs(['--port', '70000'])).toThrow('--port must be a port number from 0 to 65535, got "70000"');
    expect(() => parseCliArgs(['--webhook-url', 'localhost:3000'])).toThrow('--webhook-url must be an http or https URL');
    expect(() => parseCliArgs(['--secret-key', 'sk_live_x'])).toThrow('--secret-key must be a test-mode key');
    expect(() => parseCliArgs(['--retry-schedule', '1s,2s'])).toThrow('--retry-schedule must be whole milliseconds');
  });

  it('rejects an unknown flag and a flag without its value', () => {
    expect(() => parseCliArgs(['--webhook', 'x'])).toThrow('Unknown option --webhook');
    expect(() => parseCliArgs(['--port', '--host', 'x'])).toThrow('--port needs a value');
  });
});
