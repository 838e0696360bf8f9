// npm run verify -- FILE [--max-bytes N]: the standalone verifier (packages/verify), run from
// this repository. It is built from the sources of core and of the verifier whenever they
// changed, so it works straight after `npm ci`. Exit 0: intact. 1: a broken roll. 2: not a bundle.
import { pathToFileURL } from 'node:url';
import { buildVerifier, CLI_FILE, isStale } from '../packages/verify/build.mjs';

if (isStale()) await buildVerifier();
await import(pathToFileURL(CLI_FILE).href);
