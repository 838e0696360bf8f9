// Entry point of `npm run test:reliability` (see tools/reliability/run.ts).
import './reliability/run.ts';
