import { z } from 'zod';
import { ROLES } from '../roles.js';
import { emailSchema, singleLineText, uuidSchema } from './common.js';

const roleSchema = z.enum(ROLES, { message: `One of: ${ROLES.join(', ')}.` });

export const invitationSchema = z
  .strictObject({
    email: emailSchema,
    name: singleLineText(120),
    role: roleSchema,
    partyId: uuidSchema.nullish(),
  })
  .refine((v) => v.role !== 'customer' || !!v.partyId, {
    path: ['partyId'],
    message: 'A customer sign-in must be tied to a customer party.',
  });

export const membershipUpdateSchema = z
  .strictObject({ role: roleSchema.optional(), partyId: uuidSchema.nullish() })
  .refine((v) => v.role !== undefined || v.partyId !== undefined, { message: 'Nothing to change.' });

export const PARTY_KINDS = ['household', 'customer'] as const;
export const RELATIONSHIPS = ['family', 'neighbour', 'agency'] as const;

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { message: `At most ${max} characters.` })
    .nullish()
    .transform((s) => (s ? s : null));

export const partySchema = z.strictObject({
  kind: z.enum(PARTY_KINDS, { message: 'household or customer.' }),
  name: singleLineText(160),
  relationship: z.enum(RELATIONSHIPS, { message: 'family, neighbour or agency.' }),
  email: z.union([emailSchema, z.literal('').transform(() => null)]).nullish(),
  phone: optionalText(40).refine((s) => !s || !/[\r\n]/.test(s), { message: 'Must be a single line.' }),
  address: optionalText(400),
  notes: optionalText(2000),
});
export const partyUpdateSchema = partySchema.partial();
export type PartyInput = z.infer<typeof partySchema>;

export const partyListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.enum(['name', '-name', 'kind', '-kind', 'createdAt', '-createdAt']).default('name'),
  q: z.string().trim().max(200).optional(),
  kind: z.enum(PARTY_KINDS).optional(),
});
