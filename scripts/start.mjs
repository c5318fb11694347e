// npm start: make sure dependencies are installed, then hand over to the TypeScript stack runner.
// Plain JavaScript on purpose: this file must run on a fresh clone before node_modules exists.
import { ensureNodeModules } from './bootstrap.mjs';

try {
  await ensureNodeModules();
} catch (err) {
  console.error(`[stallpoint] ${err.message}`);
  process.exit(1);
}
const { register } = await import('tsx/esm/api');
register();
await import('./stack/start.ts');
