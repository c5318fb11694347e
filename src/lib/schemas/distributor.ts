/** Body of POST /api/distributor/refresh: nothing to choose yet, so an empty object and nothing else. */
import { z } from 'zod';

export const distributorRefreshSchema = z.strictObject({});
