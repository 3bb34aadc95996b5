import type { FieldKind } from '@hitchbook/shared/schemas/fields';

export const FIELD_KIND_LABELS: Record<FieldKind, string> = { field: 'Field', roadside: 'Road stretch' };
