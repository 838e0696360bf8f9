import { runCli } from './cli.js';

process.exitCode = runCli(process.argv.slice(2), {
  out: (l) => console.log(l),
  err: (l) => console.error(l),
});
