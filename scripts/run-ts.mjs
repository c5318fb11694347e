// Run a TypeScript script after the same dependency bootstrap: node scripts/run-ts.mjs file.ts [args]
import { pathToFileURL } from 'node:url';
import path from 'node:path';
import { ensureNodeModules } from './bootstrap.mjs';

await ensureNodeModules();
const { register } = await import('tsx/esm/api');
register();
const file = process.argv[2];
if (!file) {
  console.error('usage: node scripts/run-ts.mjs <script.ts> [args]');
  process.exit(2);
}
// The script sees its own arguments from process.argv[2] on, as under `node script args`.
process.argv.splice(1, 1);
await import(pathToFileURL(path.resolve(file)).href);
