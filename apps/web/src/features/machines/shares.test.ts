import { describe, expect, it } from 'vitest';
import type { MachineSharesDto } from '@hitchbook/shared/schemas/machines';
import { formatSharePct, mayChangeMachine, plainSharePct, tallyShares } from './shares';

describe('share tally', () => {
  it('sees thirds written to four places as a whole machine', () => {
    const tally = tallyShares([
      { partyId: 'a', sharePct: '66.6667' },
      { partyId: 'b', sharePct: '33.3333' },
    ]);
    expect(tally.total.toString()).toBe('100');
    expect(tally.complete).toBe(true);
  });

  it('says how much is left to give when the shares fall short', () => {
    const tally = tallyShares([
      { partyId: 'a', sharePct: '50' },
      { partyId: 'b', sharePct: '30' },
    ]);
    expect(tally.complete).toBe(false);
    expect(tally.remaining.toString()).toBe('20');
  });

  it('is not complete while a line is blank, even when the rest add up', () => {
    const tally = tallyShares([
      { partyId: 'a', sharePct: '100' },
      { partyId: 'b', sharePct: '' },
    ]);
    expect(tally.total.toString()).toBe('100');
    expect(tally.complete).toBe(false);
  });

  it('reports an overshoot as a negative remainder', () => {
    expect(tallyShares([{ partyId: 'a', sharePct: '120' }]).remaining.toString()).toBe('-20');
  });
});

describe('share formatting', () => {
  it('drops trailing zeros of the stored four places', () => {
    expect(formatSharePct('50.0000')).toBe('50 %');
    expect(formatSharePct('33.3333')).toBe('33.3333 %');
  });

  it('turns a stored share into what a person types, whole shares included', () => {
    expect(plainSharePct('100.0000')).toBe('100');
    expect(plainSharePct('100')).toBe('100');
    expect(plainSharePct('66.6667')).toBe('66.6667');
  });
});

describe('who may change a machine', () => {
  const share = (partyId: string) => ({ partyId, name: partyId, sharePct: '100.0000' });
  const shares: MachineSharesDto = {
    on: '2025-06-03',
    current: { effectiveFrom: '2025-01-01', shares: [share('elders')] },
    history: [
      { effectiveFrom: '2025-09-01', shares: [share('son')] },
      { effectiveFrom: '2025-01-01', shares: [share('elders')] },
      { effectiveFrom: '2019-01-01', shares: [share('parents')] },
    ],
  };

  it('lets a partner whose household owns a share today or from a later date', () => {
    expect(mayChangeMachine('partner', 'elders', shares)).toBe(true);
    expect(mayChangeMachine('partner', 'son', shares)).toBe(true);
  });

  it('refuses a partner whose household owned it only in the past', () => {
    expect(mayChangeMachine('partner', 'parents', shares)).toBe(false);
  });

  it('lets the owner always and never the bookkeeper or an operator', () => {
    expect(mayChangeMachine('owner', null, undefined)).toBe(true);
    expect(mayChangeMachine('bookkeeper', 'elders', shares)).toBe(false);
    expect(mayChangeMachine('operator', null, shares)).toBe(false);
  });
});
