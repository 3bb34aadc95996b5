import { z } from 'zod';
import { singleLineText, uuidSchema } from './common.js';
import { optionalLine, optionalNotes, scaledDecimal, searchQuery, whenValid, type RuleIssue } from './machines.js';

export const FIELD_KINDS = ['field', 'roadside'] as const;
export type FieldKind = (typeof FIELD_KINDS)[number];

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

// ---------------------------------------------------------------- boundaries (GeoJSON, RFC 7946)

/** Enough for a surveyed field edge; a larger file is almost always the wrong layer. */
export const MAX_BOUNDARY_POSITIONS = 50_000;

export type PolygonCoordinates = number[][][];
export type BoundaryGeometry = { type: 'Polygon'; coordinates: PolygonCoordinates } | { type: 'MultiPolygon'; coordinates: PolygonCoordinates[] };

// RFC 7946 §3.1.1: longitude first, then latitude, in WGS84 degrees; an altitude may follow.
const position = z
  .array(z.number({ error: 'Coordinates must be numbers' }), { error: 'A position is [longitude, latitude]' })
  .min(2, 'A position is [longitude, latitude]')
  .max(3, 'A position is [longitude, latitude] or [longitude, latitude, altitude]')
  .superRefine((p, ctx) => {
    const [lon = 0, lat = 0] = p;
    if (lon < -180 || lon > 180) ctx.addIssue({ code: 'custom', path: [0], message: 'Longitude must be between -180 and 180 (longitude comes first)' });
    if (lat < -90 || lat > 90) ctx.addIssue({ code: 'custom', path: [1], message: 'Latitude must be between -90 and 90' });
  });

// RFC 7946 §3.1.6: a ring has at least four positions and ends where it starts.
const linearRing = z
  .array(position, { error: 'A ring is a list of positions' })
  .min(4, 'A ring needs at least four positions (the last repeats the first)')
  .refine((ring) => ring.length < 4 || (ring[0]![0] === ring.at(-1)![0] && ring[0]![1] === ring.at(-1)![1]), {
    message: 'A ring must end at the position it starts from',
  });

const polygonCoordinates = z.array(linearRing, { error: 'A polygon is a list of rings' }).min(1, 'A polygon needs an outer ring');

const polygonGeometry = z.looseObject({ type: z.literal('Polygon'), coordinates: polygonCoordinates });
const multiPolygonGeometry = z.looseObject({
  type: z.literal('MultiPolygon'),
  coordinates: z.array(polygonCoordinates).min(1, 'A multipolygon needs at least one polygon'),
});
const areaGeometry = z.discriminatedUnion('type', [polygonGeometry, multiPolygonGeometry], {
  error: 'The boundary must be a Polygon or MultiPolygon',
});
const areaFeature = z.looseObject({ type: z.literal('Feature'), geometry: areaGeometry });

const asGeometry = (g: z.output<typeof areaGeometry>): BoundaryGeometry =>
  g.type === 'Polygon' ? { type: 'Polygon', coordinates: g.coordinates } : { type: 'MultiPolygon', coordinates: g.coordinates };

/**
 * A field edge as GeoJSON: a Polygon or MultiPolygon, bare, in a Feature, or as the features of a
 * FeatureCollection (joined into one MultiPolygon). Only the geometry is kept.
 */
export const boundaryGeometrySchema = z
  .discriminatedUnion(
    'type',
    [
      polygonGeometry,
      multiPolygonGeometry,
      areaFeature,
      z.looseObject({ type: z.literal('FeatureCollection'), features: z.array(areaFeature).min(1, 'The collection has no features') }),
    ],
    { error: 'Give a GeoJSON Polygon, MultiPolygon, Feature or FeatureCollection' },
  )
  .transform((input): BoundaryGeometry => {
    if (input.type === 'Feature') return asGeometry(input.geometry);
    if (input.type === 'FeatureCollection') {
      const polygons = input.features.flatMap((f) => (f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates));
      return polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0]! } : { type: 'MultiPolygon', coordinates: polygons };
    }
    return asGeometry(input);
  })
  .refine((geometry) => countPositions(geometry) <= MAX_BOUNDARY_POSITIONS, {
    message: `At most ${MAX_BOUNDARY_POSITIONS} positions; simplify the boundary first`,
  });

function countPositions(geometry: BoundaryGeometry): number {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return polygons.reduce((n, rings) => n + rings.reduce((m, ring) => m + ring.length, 0), 0);
}

// ---------------------------------------------------------------- fields and road stretches

const fieldFields = {
  name: singleLineText(120),
  /** The acres the family farms or bills by; a road stretch's acres follow from length × width. */
  acres: scaledDecimal({ atLeast: 0, atMost: 100_000 }, 3).optional(),
  /** Landlord or owner: a household or a customer. */
  ownerPartyId: uuidSchema.nullish(),
  farmLabel: optionalLine(80),
  notes: optionalNotes(),
  boundary: boundaryGeometrySchema.nullish(),
  /** A GeoJSON file sent to /api/uploads with purpose field-boundary, instead of `boundary`. */
  boundaryUploadId: uuidSchema.optional(),
  roadName: optionalLine(120),
  roadFrom: optionalLine(120),
  roadTo: optionalLine(120),
  lengthMiles: scaledDecimal({ above: 0, atMost: 1000 }, 3).nullish(),
  /** Mowing width across the ditch and shoulder. */
  widthFt: scaledDecimal({ above: 0, atMost: 200 }, 2).nullish(),
};

export interface FieldRuleSubject {
  kind: FieldKind;
  acres?: unknown;
  roadName?: unknown;
  roadFrom?: unknown;
  roadTo?: unknown;
  lengthMiles?: unknown;
  widthFt?: unknown;
  boundary?: unknown;
  boundaryUploadId?: unknown;
}

const isEmpty = (value: unknown) => value === undefined || value === null;
const ROAD_ONLY = ['roadName', 'roadFrom', 'roadTo', 'lengthMiles', 'widthFt'] as const;

/** The API runs these again on the merged row of an update. */
export function fieldRuleIssues(field: FieldRuleSubject): RuleIssue[] {
  const issues: RuleIssue[] = [];
  if (field.kind === 'field') {
    if (isEmpty(field.acres)) issues.push({ path: 'acres', message: 'Required for a field' });
    for (const key of ROAD_ONLY) {
      if (!isEmpty(field[key])) issues.push({ path: key, message: 'Only a road stretch (kind roadside) has this' });
    }
  } else {
    if (isEmpty(field.roadName)) issues.push({ path: 'roadName', message: 'Required for a road stretch' });
    if (isEmpty(field.lengthMiles)) issues.push({ path: 'lengthMiles', message: 'Required for a road stretch' });
    if (isEmpty(field.widthFt)) issues.push({ path: 'widthFt', message: 'Required for a road stretch: the mowing width in feet' });
  }
  if (!isEmpty(field.boundary) && !isEmpty(field.boundaryUploadId)) {
    issues.push({ path: 'boundaryUploadId', message: 'Give the boundary inline or as an upload, not both' });
  }
  return issues;
}

export const fieldCreateSchema = z
  .strictObject({ kind: oneOf(FIELD_KINDS).default('field'), ...fieldFields })
  .superRefine((field, ctx) => {
    for (const issue of fieldRuleIssues(field)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
  }, whenValid('kind', FIELD_KINDS));
export type FieldCreateInput = z.input<typeof fieldCreateSchema>;
export type FieldCreate = z.output<typeof fieldCreateSchema>;

/** The kind is fixed once created; an archived field stays on the entries that used it. */
export const fieldUpdateSchema = z
  .strictObject({ ...fieldFields, archived: z.boolean({ error: 'true or false' }) })
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { message: 'Nothing to change' });
export type FieldUpdateInput = z.input<typeof fieldUpdateSchema>;
export type FieldUpdate = z.output<typeof fieldUpdateSchema>;

export const FIELD_SORTS = ['name', '-name', 'acres', '-acres', 'farmLabel', '-farmLabel', 'createdAt', '-createdAt'] as const;

export const fieldListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: oneOf(FIELD_SORTS).default('name'),
  q: searchQuery,
  kind: oneOf(FIELD_KINDS).optional(),
  farmLabel: searchQuery,
  ownerPartyId: uuidSchema.optional(),
  /** Active fields unless asked otherwise. */
  archived: oneOf(['false', 'true', 'all']).default('false'),
});
export type FieldListQuery = z.output<typeof fieldListQuerySchema>;

export interface FieldDto {
  id: string;
  kind: FieldKind;
  name: string;
  /** Entered acres for a field; length × width for a road stretch. */
  acres: string;
  /** Computed geodesically from the boundary; shown beside the entered acres. */
  boundaryAcres: string | null;
  hasBoundary: boolean;
  /** Single-field reads only. */
  boundary?: BoundaryGeometry | null;
  ownerPartyId: string | null;
  ownerName: string | null;
  farmLabel: string | null;
  notes: string | null;
  roadName: string | null;
  roadFrom: string | null;
  roadTo: string | null;
  lengthMiles: string | null;
  widthFt: string | null;
  archived: boolean;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
}
