import { describe, expect, it } from 'vitest';
import { ApiError } from './api';
import { placeServerIssues } from './form';

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

  it('adds issues no field can show to the banner', () => {
    const error = new ApiError(400, 'Invalid request.', [
      { path: '', message: 'Nothing to change.' },
      { path: 'token', message: 'Too short.' },
    ]);
    expect(placeServerIssues(values, error)).toEqual({
      fieldErrors: {},
      banner: 'Invalid request. Nothing to change. Too short.',
    });
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
