import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../core/config.js';

const base = { DATABASE_URL: 'postgres://x@127.0.0.1/x', JWT_SECRET: 'k'.repeat(40), NODE_ENV: 'production' };
const stripeEnv = { STRIPE_SECRET_KEY: 'sk_test_x', STRIPE_WEBHOOK_SECRET: 'whsec_x' };

describe('card payment settings', () => {
  it('leaves card payments off unless both the key and the webhook secret are set', () => {
    expect(loadConfig(base).stripe).toBeNull();
    expect(loadConfig({ ...base, STRIPE_SECRET_KEY: 'sk_test_x' }).stripe).toBeNull();
    expect(loadConfig({ ...base, ...stripeEnv }).stripe).toEqual({ secretKey: 'sk_test_x', webhookSecret: 'whsec_x', host: null, port: null, protocol: 'https' });
  });

  it('speaks plain http only to a local fake on this machine, never to another host', () => {
    expect(loadConfig({ ...base, ...stripeEnv, STRIPE_API_HOST: '127.0.0.1', STRIPE_API_PORT: '12111' }).stripe).toMatchObject({ host: '127.0.0.1', port: 12111, protocol: 'http' });
    expect(loadConfig({ ...base, ...stripeEnv, STRIPE_API_HOST: 'stripe.evil.example', STRIPE_API_PORT: '80' }).stripe).toMatchObject({ protocol: 'https' });
  });

  it('refuses to start with a port that is not a port', () => {
    expect(() => loadConfig({ ...base, ...stripeEnv, STRIPE_API_PORT: '70000' })).toThrow('STRIPE_API_PORT');
  });
});
