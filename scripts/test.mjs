// npm test: same bootstrap as npm start, on a throwaway database, then every test.
import { ensureNodeModules } from './bootstrap.mjs';

try {
  await ensureNodeModules();
} catch (err) {
  console.error(`[stallpoint] ${err.message}`);
  process.exit(1);
}
const { register } = await import('tsx/esm/api');
register();
await import('./stack/test.ts');
