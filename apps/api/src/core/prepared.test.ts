import { describe, expect, it } from 'vitest';
import { statementName } from './prepared.js';

describe('prepared statement names', () => {
  const text = 'select "name" from "operations" where "id" = $1';

  it('are the same for the same text and differ for another', () => {
    expect(statementName(text)).toBe(statementName(`select "name" from "operations" where "id" = $1`));
    expect(statementName(text)).not.toBe(statementName(`${text} limit $2`));
  });

  it('fit the server identifier limit of 63 bytes', () => {
    expect(statementName(text)).toMatch(/^hb_[\w-]{27}$/);
  });
});
