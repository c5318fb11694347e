/** What an admin sends to set one exchange rate into the organisation's currency. */
import { z } from 'zod';
import { isoDateSchema } from './parts.ts';

export const currencyRateInputSchema = z.object({
  currency: z
    .string({ error: 'Currency is required' })
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, { error: 'Currency is a three-letter ISO 4217 code such as USD' }),
  rateToOrg: z
    .number({ error: 'Rate must be a number' })
    .finite()
    .gt(0, { error: 'Rate must be above 0' })
    .max(1_000_000, { error: 'Rate must be at most 1 000 000' }),
  asOf: isoDateSchema,
});
export type CurrencyRateInput = z.infer<typeof currencyRateInputSchema>;
