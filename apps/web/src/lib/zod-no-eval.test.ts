import { describe, expect, it } from 'vitest';

describe('zod without eval', () => {
  it('builds object parsers without new Function() once the entry has run', async () => {
    await import('./zod-no-eval');
    const { z } = await import('zod');
    expect(z.config().jitless).toBe(true);

    const compiled = globalThis.Function;
    let calls = 0;
    globalThis.Function = new Proxy(compiled, {
      construct(target, args) {
        calls += 1;
        return Reflect.construct(target, args) as object;
      },
    });
    try {
      const schema = z.strictObject({ email: z.string().min(1), count: z.number() });
      expect(schema.parse({ email: 'a@b.example', count: 2 })).toEqual({ email: 'a@b.example', count: 2 });
      expect(schema.safeParse({ email: '', count: 2 }).success).toBe(false);
    } finally {
      globalThis.Function = compiled;
    }
    expect(calls).toBe(0);
  });
});
