import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import './zod-no-eval';
import { ApiError } from './api';
import { placeServerIssues, schemaErrors, unplacedIssues } from './serverIssues';

const values = { listPrice: '', members: [{ name: 'Hill place', ownershipPct: '60' }] };

describe('placing server issues on a form', () => {
  it('puts an issue on the field its path names, dotted paths into lists included', () => {
    const error = new ApiError(400, 'Check the highlighted fields.', [
      { path: 'listPrice', message: 'Required' },
      { path: 'members.0.ownershipPct', message: 'Must be at most 100' },
    ]);
    expect(placeServerIssues(values, error)).toEqual({
      fieldErrors: { listPrice: 'Required', 'members.0.ownershipPct': 'Must be at most 100' },
      banner: 'Check the highlighted fields.',
    });
  });

  it('shows only the issues no field can show when no field is marked', () => {
    const error = new ApiError(400, 'Invalid request.', [
      { path: '', message: 'Nothing to change.' },
      { path: 'token', message: 'Too short.' },
    ]);
    expect(placeServerIssues(values, error)).toEqual({
      fieldErrors: {},
      banner: 'Nothing to change. Too short.',
    });
  });

  it('keeps the general message beside an unplaceable issue when a field is marked too', () => {
    const error = new ApiError(400, 'Some fields need attention.', [
      { path: 'listPrice', message: 'Required' },
      { path: 'token', message: 'Expired.' },
    ]);
    expect(placeServerIssues(values, error).banner).toBe('Some fields need attention. Expired.');
  });

  it('maps request paths to field paths when the form is shaped differently', () => {
    const error = new ApiError(400, 'Invalid request.', [{ path: 'members.0.id', message: '"Hill place" appears twice' }]);
    const issuePath = (path: string) => path.replace(/\.id$/, '.name');
    expect(placeServerIssues(values, error, issuePath).fieldErrors).toEqual({
      'members.0.name': '"Hill place" appears twice',
    });
  });

  it('shows the message alone for a refusal without issues', () => {
    const error = new ApiError(401, 'Wrong e-mail or password.');
    expect(placeServerIssues(values, error)).toEqual({ fieldErrors: {}, banner: 'Wrong e-mail or password.' });
  });
});

describe('schema issues as the forms show them', () => {
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

describe('issues no field can show', () => {
  const values = { name: 'Hill place', members: [{ sharePct: '60' }] };

  it('joins the messages whose path names no field of the form, and leaves out those a field shows', () => {
    expect(unplacedIssues({ name: 'Required.', 'members.0.sharePct': 'Whole percent.', period: 'The period ends before it starts.', clientId: 'Missing.' }, values)).toBe(
      'The period ends before it starts. Missing.',
    );
  });

  it('gives no banner when every message has its field', () => {
    expect(unplacedIssues({ name: 'Required.', 'members.0.sharePct': 'Whole percent.' }, values)).toBeNull();
  });
});
