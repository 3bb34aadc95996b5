import { describe, expect, it } from 'vitest';
import { orderWorkspaces } from '../../../packages/devstack/lib/workspaces.mjs';

const ORDER = ['packages/shared', 'packages/mail-catcher', 'packages/db', 'apps/api', 'apps/web', 'tests'];

describe('orderWorkspaces', () => {
  it('keeps the fixed order and leaves out workspaces that are not there', () => {
    expect(orderWorkspaces(ORDER, ['tests', 'apps/api', 'packages/shared'])).toEqual(['packages/shared', 'apps/api', 'tests']);
  });

  it('runs a new package after the other packages and a new app before the browser tests', () => {
    const present = ['apps/admin', 'apps/api', 'apps/web', 'packages/db', 'packages/mail-catcher', 'packages/shared', 'packages/stripe-fake', 'tests'];
    expect(orderWorkspaces(ORDER, present)).toEqual([
      'packages/shared',
      'packages/mail-catcher',
      'packages/db',
      'packages/stripe-fake',
      'apps/api',
      'apps/web',
      'apps/admin',
      'tests',
    ]);
  });
});
