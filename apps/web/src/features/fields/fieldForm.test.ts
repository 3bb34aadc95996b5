import { describe, expect, it } from 'vitest';
import { fieldCreateSchema, fieldUpdateSchema } from '@hitchbook/shared/schemas/fields';
import { fieldCreatePayload, fieldFormValues, fieldUpdatePayload, stripAcresPreview } from './fieldForm';

describe('road strip acres', () => {
  it('is length × width ÷ 8.25: a mile of 10-ft strip is 1.21 acres', () => {
    expect(stripAcresPreview('1', '10')).toBe('1.21');
    expect(stripAcresPreview('2.5', '12')).toBe('3.64');
  });

  it('waits until both figures are numbers', () => {
    expect(stripAcresPreview('', '10')).toBeNull();
    expect(stripAcresPreview('1.5', 'ten')).toBeNull();
  });
});

describe('field payload', () => {
  it('sends a field’s acres and no road figures', () => {
    const payload = fieldCreatePayload({ ...fieldFormValues(null), name: 'Home West', acres: '80.5', roadName: 'left over', lengthMiles: '2' });
    expect(payload).toMatchObject({ kind: 'field', acres: '80.5', roadName: null, lengthMiles: null });
    expect(fieldCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('sends a road stretch’s length and width and lets the server work out its acres', () => {
    const values = { ...fieldFormValues(null, 'roadside'), name: 'County Rd 9, north ditch', roadName: 'County Road 9', lengthMiles: '1.75', widthFt: '12', acres: '99' };
    const payload = fieldCreatePayload(values);
    expect(payload.acres).toBeUndefined();
    expect(payload).toMatchObject({ kind: 'roadside', roadName: 'County Road 9', lengthMiles: '1.75', widthFt: '12' });
    expect(fieldCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('is refused for a road stretch without its width', () => {
    const values = { ...fieldFormValues(null, 'roadside'), name: 'Saltlick Lane', roadName: 'Saltlick Lane', lengthMiles: '1' };
    const result = fieldCreateSchema.safeParse(fieldCreatePayload(values));
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain('widthFt');
  });

  it('attaches a new boundary file, or removes the stored boundary on request', () => {
    const base = { ...fieldFormValues(null), name: 'Home West', acres: '80' };
    const upload = '7d0c8c1e-1b7a-4d55-8f0e-6f3f0e6b9a10';
    expect(fieldUpdatePayload({ ...base, boundaryUploadId: upload })).toMatchObject({ boundaryUploadId: upload });
    const removal = fieldUpdatePayload({ ...base, removeBoundary: true });
    expect(removal.boundary).toBeNull();
    expect(fieldUpdateSchema.safeParse(removal).success).toBe(true);
    expect('boundary' in fieldUpdatePayload(base)).toBe(false);
  });
});
