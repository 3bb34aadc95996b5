import { describe, expect, it } from 'vitest';
import { ApiError } from './api';
import { isDatabaseDown, noteServerError, noteServerSuccess } from './serviceStatus';

describe('database outage notice', () => {
  it('turns on with a 503 answer and off with the next good answer', () => {
    noteServerError(new ApiError(503, 'Database unavailable.'));
    expect(isDatabaseDown()).toBe(true);
    noteServerSuccess();
    expect(isDatabaseDown()).toBe(false);
  });

  it('stays off for other failures, which the screen reports itself', () => {
    noteServerSuccess();
    noteServerError(new ApiError(500, 'Boom.'));
    noteServerError(new ApiError(0, 'Offline.'));
    noteServerError(new Error('not from the server'));
    expect(isDatabaseDown()).toBe(false);
  });
});
