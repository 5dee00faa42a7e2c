/**
 * `npm run bench`: runs every tests/bench/*.bench.ts module's default-exported async function in
 * turn (alphabetical order), one at a time so they do not compete for the cores. A failing bench
 * is reported and makes the run exit with status 1; the others still run.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();

let failed = 0;
for (const file of files) {
  const started = performance.now();
  console.log(`\n=== ${file}`);
  try {
    const mod = (await import(pathToFileURL(join(here, file)).href)) as { default?: () => Promise<void> };
    if (typeof mod.default !== 'function') throw new Error('no default-exported function');
    await mod.default();
    console.log(`=== ${file}: done in ${((performance.now() - started) / 1000).toFixed(1)} s`);
  } catch (e) {
    failed++;
    console.log(`=== ${file}: FAILED: ${(e as Error).message}`);
  }
}
if (failed) process.exitCode = 1;
