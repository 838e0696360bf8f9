// Writes docs/examples/bundle.json from the invented scenario (deterministic).
// Usage: npm run build -w @beadroll/core && node tools/gen-example-bundle.mjs
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as core from '@beadroll/core';
import { buildExampleBundle } from './example-bundle.mjs';

const out = fileURLToPath(new URL('../docs/examples/bundle.json', import.meta.url));
writeFileSync(out, JSON.stringify(buildExampleBundle(core), null, 2) + '\n');
console.log(`wrote ${out}`);
