import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import './zod-no-eval';
import { schemaErrors } from './form';

describe('schema issues for the form recipe', () => {
  const schema = z.strictObject({
    name: z.string().min(1, { message: 'Required.' }),
    machines: z.array(z.strictObject({ sharePct: z.string().regex(/^\d+$/, { message: 'Whole percent.' }) })),
  });

  it('names each issue by its dotted path, into lists too', () => {
    expect(schemaErrors(schema, { name: '', machines: [{ sharePct: '50' }, { sharePct: 'half' }] })).toEqual({
      name: 'Required.',
      'machines.1.sharePct': 'Whole percent.',
    });
  });

  it('finds nothing wrong with a valid request', () => {
    expect(schemaErrors(schema, { name: 'Hill place', machines: [] })).toEqual({});
  });

  it('keeps the last issue when one field breaks two rules, as the form shows one message', () => {
    const twice = z.strictObject({ code: z.string().min(3, { message: 'Too short.' }).regex(/^[a-z]+$/, { message: 'Letters only.' }) });
    expect(schemaErrors(twice, { code: '1' })).toEqual({ code: 'Letters only.' });
  });
});
