import { z } from 'zod';

export const uuidSchema = z.uuid({ message: 'Must be a valid id.' });

/** Text fields that end up in e-mail headers or PDFs must not carry line breaks (header injection). */
export const singleLineText = (max: number) =>
  z
    .string()
    .trim()
    .min(1, { message: 'Required.' })
    .max(max, { message: `At most ${max} characters.` })
    .refine((s) => !/[\r\n\u0000]/.test(s), { message: 'Must be a single line.' });

/**
 * An instant with its UTC offset, within the years the product deals in; the database would store
 * year 17 happily, but neither people nor the date libraries downstream mean it.
 */
export const timestampSchema = (message: string) =>
  z.iso.datetime({ offset: true, message }).refine(
    (s) => {
      const year = new Date(s).getUTCFullYear();
      return year >= 1970 && year <= 2100;
    },
    { message: 'Must fall between the years 1970 and 2100.' },
  );

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, { message: 'At most 254 characters.' })
  .refine((s) => !/[\r\n]/.test(s), { message: 'Must be a single line.' })
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }));

export const pageQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.string().max(64).optional(),
  q: z.string().trim().max(200).optional(),
});
export type PageQuery = z.infer<typeof pageQuerySchema>;

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}
