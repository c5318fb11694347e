// npm test: same bootstrap as npm start, on a throwaway database, then every test.
import { ensureNodeModules } from './bootstrap.mjs';

await ensureNodeModules();
const { register } = await import('tsx/esm/api');
register();
await import('./stack/test.ts');
