/** What a buyer sends to set the preferred source and note of one option of a shortlist line. */
import { z } from 'zod';
import { INT_UNSIGNED_MAX } from './bounds.ts';

/** Longest note (the shortlist_preferences.note column holds 500 characters). */
export const PREFERENCE_NOTE_MAX = 500;

const id = (what: string) =>
  z
    .number({ error: `${what} must be a whole number` })
    .int({ error: `${what} must be a whole number` })
    .min(1, { error: `${what} must be at least 1` })
    .max(INT_UNSIGNED_MAX, { error: `${what} is too large` });

export const shortlistPreferenceInputSchema = z.object({
  line: z.enum(['motor', 'switch', 'driver', 'diode'], { error: 'Line is one of motor, switch, driver, diode' }),
  partId: id('Part'),
  /** A source of that part; null: buy from the cheapest source. */
  sourceId: id('Source').nullable(),
  /** Null or empty: no note. */
  note: z
    .string({ error: 'Note must be text' })
    .trim()
    .max(PREFERENCE_NOTE_MAX, { error: `Note is at most ${PREFERENCE_NOTE_MAX} characters` })
    .nullable()
    .transform((s) => (s === '' ? null : s)),
});
export type ShortlistPreferenceInput = z.infer<typeof shortlistPreferenceInputSchema>;
