/** What buyers send to keep supplier contacts and to send, answer and close requests for quotation. */
import { z } from 'zod';
import { INT_UNSIGNED_MAX } from './bounds.ts';

export const QUOTE_NOTES_MAX = 1000;
export const QUOTE_LINE_NOTE_MAX = 500;
export const QUOTE_LINES_MAX = 100;
/** Largest quantity on a request (matches the shortlist's largest build × a margin; far below INT UNSIGNED). */
export const QUOTE_QTY_MAX = 100_000_000;

const id = (what: string) =>
  z
    .number({ error: `${what} must be a whole number` })
    .int({ error: `${what} must be a whole number` })
    .min(1, { error: `${what} must be at least 1` })
    .max(INT_UNSIGNED_MAX, { error: `${what} is too large` });

const count = (what: string, min: number) =>
  z
    .number({ error: `${what} must be a whole number` })
    .int({ error: `${what} must be a whole number` })
    .min(min, { error: `${what} must be at least ${min}` })
    .max(QUOTE_QTY_MAX, { error: `${what} is at most ${QUOTE_QTY_MAX}` });

const text = (what: string, max: number) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .min(1, { error: `${what} is required` })
    .max(max, { error: `${what} is at most ${max} characters` });

const optionalText = (what: string, max: number) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, { error: `${what} is at most ${max} characters` })
    .nullable()
    .optional()
    .transform((s) => (s ? s : null));

const isoDate = (what: string) =>
  z
    .string({ error: `${what} must be a date (YYYY-MM-DD)` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: `${what} must be a date (YYYY-MM-DD)` })
    .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
      error: `${what} is not a real date`,
    });

export const supplierContactInputSchema = z.object({
  name: text('Name', 120),
  company: text('Company', 120),
  email: z
    .string({ error: 'E-mail must be text' })
    .trim()
    .max(320, { error: 'E-mail is at most 320 characters' })
    .pipe(z.email({ error: 'E-mail is not an e-mail address' })),
});
export type SupplierContactInput = z.infer<typeof supplierContactInputSchema>;

export const quoteLineInputSchema = z.object({
  designId: id('Design'),
  line: z.enum(['motor', 'switch', 'driver', 'diode'], { error: 'Line is one of motor, switch, driver, diode' }),
  partId: id('Part'),
  quantityNeeded: count('Quantity needed', 1),
  orderQuantity: count('Order quantity', 1),
  notes: optionalText('Line notes', QUOTE_LINE_NOTE_MAX),
});

export const quoteRequestInputSchema = z.object({
  contactId: id('Supplier contact'),
  /** The client's key for this send: a repeated send with the same key (a double click) returns the first request. */
  idempotencyKey: z
    .string({ error: 'Idempotency key must be text' })
    .regex(/^[A-Za-z0-9_-]{8,100}$/, { error: 'Idempotency key is 8 to 100 letters, digits, - or _' }),
  wantedBy: isoDate('Wanted by').nullable().optional().default(null),
  notes: optionalText('Notes', QUOTE_NOTES_MAX),
  lines: z
    .array(quoteLineInputSchema, { error: 'Lines must be a list' })
    .min(1, { error: 'Choose at least one line' })
    .max(QUOTE_LINES_MAX, { error: `At most ${QUOTE_LINES_MAX} lines` }),
});
export type QuoteRequestInput = z.infer<typeof quoteRequestInputSchema>;

export const quoteAnswerLineSchema = z.object({
  lineId: id('Line'),
  unitPrice: z
    .number({ error: 'Unit price must be a number' })
    .positive({ error: 'Unit price must be more than 0' })
    .max(9_999_999, { error: 'Unit price is too large' }),
  currency: z
    .string({ error: 'Currency must be text' })
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, { error: 'Currency is a three-letter code (EUR, USD …)' }),
  moq: count('MOQ', 1),
  leadTimeDays: z
    .number({ error: 'Lead time must be a whole number of days' })
    .int({ error: 'Lead time must be a whole number of days' })
    .min(0, { error: 'Lead time must be at least 0 days' })
    .max(3650, { error: 'Lead time is at most 3650 days' }),
  validUntil: isoDate('Valid until'),
});

export const quoteAnswerInputSchema = z.object({
  lines: z
    .array(quoteAnswerLineSchema, { error: 'Lines must be a list' })
    .min(1, { error: 'Answer at least one line' })
    .max(QUOTE_LINES_MAX, { error: `At most ${QUOTE_LINES_MAX} lines` }),
});
export type QuoteAnswerInput = z.infer<typeof quoteAnswerInputSchema>;
