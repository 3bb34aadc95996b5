import { describe, expect, it } from 'vitest';
import { isApiError } from './api';
import { fileNameFromDisposition, transferErrorFrom } from './fileTransfer';

describe('download file names', () => {
  it('prefers the UTF-8 name the server encodes', () => {
    const header = `attachment; filename="Tavin_s 65.pdf"; filename*=UTF-8''Tavin%E2%80%99s%2065.pdf`;
    expect(fileNameFromDisposition(header, 'receipt')).toBe('Tavin’s 65.pdf');
  });

  it('takes the plain quoted name when no encoded one is given', () => {
    expect(fileNameFromDisposition('attachment; filename="work-entries-2025-06-03.csv"', 'x.csv')).toBe('work-entries-2025-06-03.csv');
  });

  it('falls back when the header is missing or names nothing', () => {
    expect(fileNameFromDisposition(null, 'receipt')).toBe('receipt');
    expect(fileNameFromDisposition('attachment', 'receipt')).toBe('receipt');
  });
});

describe('upload errors', () => {
  it('keeps the message, the field issues and the body of a refused upload', () => {
    const body = { message: 'Nothing was imported: 1 row needs attention.', issues: [{ path: 'row 3, hours', message: 'Must be at most 24' }], invalid: 1 };
    const error = transferErrorFrom(400, JSON.stringify(body));
    expect(isApiError(error)).toBe(true);
    expect(error.status).toBe(400);
    expect(error.message).toBe(body.message);
    expect(error.issues).toEqual([{ path: 'row 3, hours', message: 'Must be at most 24' }]);
    expect(error.body).toEqual(body);
  });

  it('joins array paths with dots and explains a bare 413', () => {
    expect(transferErrorFrom(400, JSON.stringify({ message: 'Bad', issues: [{ path: ['shares', 0, 'partyId'], message: 'x' }] })).issues[0]?.path).toBe(
      'shares.0.partyId',
    );
    expect(transferErrorFrom(413, '').message).toBe('That file is too large to upload.');
  });
});
