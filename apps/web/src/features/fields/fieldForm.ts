import { isDecimalString } from '@hitchbook/shared/decimal';
import type { FieldCreateInput, FieldDto, FieldKind, FieldUpdateInput } from '@hitchbook/shared/schemas/fields';
import { roadStripAcres } from '@hitchbook/shared/units';

export interface FieldFormValues {
  kind: FieldKind;
  name: string;
  acres: string;
  ownerPartyId: string;
  farmLabel: string;
  notes: string;
  roadName: string;
  roadFrom: string;
  roadTo: string;
  lengthMiles: string;
  widthFt: string;
  /** A boundary file sent to the uploads route, waiting to be attached. */
  boundaryUploadId: string;
  /** On an edit: take the stored boundary off. */
  removeBoundary: boolean;
}

const text = (value: string | null | undefined) => value ?? '';

export function fieldFormValues(field: FieldDto | null, kind: FieldKind = 'field'): FieldFormValues {
  return {
    kind: field?.kind ?? kind,
    name: text(field?.name),
    // A road stretch's acres follow from its length and width, so there is nothing to type.
    acres: field?.kind === 'field' ? field.acres : '',
    ownerPartyId: text(field?.ownerPartyId),
    farmLabel: text(field?.farmLabel),
    notes: text(field?.notes),
    roadName: text(field?.roadName),
    roadFrom: text(field?.roadFrom),
    roadTo: text(field?.roadTo),
    lengthMiles: text(field?.lengthMiles),
    widthFt: text(field?.widthFt),
    boundaryUploadId: '',
    removeBoundary: false,
  };
}

/** The strip acres of a road stretch as they are typed, or null until both figures read as numbers. */
export function stripAcresPreview(lengthMiles: string, widthFt: string): string | null {
  const length = lengthMiles.trim();
  const width = widthFt.trim();
  if (!isDecimalString(length) || !isDecimalString(width)) return null;
  return roadStripAcres(length, width).toFixed(2);
}

const orNull = (value: string) => (value.trim() ? value.trim() : null);

function kindFields(values: FieldFormValues) {
  if (values.kind === 'field') {
    return { acres: values.acres.trim() || undefined, roadName: null, roadFrom: null, roadTo: null, lengthMiles: null, widthFt: null };
  }
  return {
    roadName: orNull(values.roadName),
    roadFrom: orNull(values.roadFrom),
    roadTo: orNull(values.roadTo),
    lengthMiles: orNull(values.lengthMiles),
    widthFt: orNull(values.widthFt),
  };
}

function commonFields(values: FieldFormValues) {
  return {
    name: values.name,
    ownerPartyId: values.ownerPartyId || null,
    farmLabel: orNull(values.farmLabel),
    notes: orNull(values.notes),
    ...kindFields(values),
  };
}

export function fieldCreatePayload(values: FieldFormValues): FieldCreateInput {
  return { kind: values.kind, ...commonFields(values), boundaryUploadId: values.boundaryUploadId || undefined };
}

/** The kind is fixed once created; a new boundary file replaces the old one, or the old one is removed. */
export function fieldUpdatePayload(values: FieldFormValues): FieldUpdateInput {
  const boundary = values.boundaryUploadId ? { boundaryUploadId: values.boundaryUploadId } : values.removeBoundary ? { boundary: null } : {};
  return { ...commonFields(values), ...boundary };
}
