// `npm test`: installs what the suites need, starts a throw-away PostgreSQL cluster, runs lint,
// type checks, core, server, web and browser suites, and ends with one `tests: N passed, M failed` line.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join, relative } from 'node:path';
import { DATA_DIR, REPO } from './lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PgTarget, type PrivateCluster } from './lib/pg.ts';
import { spawn } from 'node:child_process';
import {
  aptInstall,
  freePort,
  onShutdown,
  runInherit,
  stopChildren,
  track,
  UserFacingError,
} from './lib/proc.ts';

interface SuiteResult {
  name: string;
  passed: number;
  failed: number;
  /** What failed, one line each, repeated just above the closing lines so a short tail shows it. */
  failures?: string[];
}

const quick = process.argv.includes('--quick');
const resultsDir = join(DATA_DIR, 'test-results');
let cluster: PrivateCluster | undefined;

function cleanup(): void {
  cluster?.stop();
  if (cluster) rmSync(join(DATA_DIR, 'test-pg'), { recursive: true, force: true });
  cluster = undefined;
}

/** A step that passes or fails as a whole (lint, type check, build) counts as one test. */
async function step(
  name: string,
  cmd: string,
  args: string[],
  env?: NodeJS.ProcessEnv,
): Promise<SuiteResult> {
  console.log(`\n── ${name}`);
  const code = await runInherit(cmd, args, { cwd: REPO, env: env ?? process.env });
  return code === 0
    ? { name, passed: 1, failed: 0 }
    : { name, passed: 0, failed: 1, failures: [`${name}: exit code ${code}`] };
}

/**
 * Runs a command that prints its own closing line `LABEL: N passed, M failed`, and counts that
 * (a run that prints no such line, or exits non-zero with no failure counted, is one failure).
 */
async function counted(
  name: string,
  label: string,
  cmd: string,
  args: string[],
  env: NodeJS.ProcessEnv,
): Promise<SuiteResult> {
  console.log(`\n── ${name}`);
  const out: string[] = [];
  const code = await new Promise<number>((resolve, reject) => {
    const child = track(spawn(cmd, args, { cwd: REPO, env, stdio: ['ignore', 'pipe', 'inherit'] }));
    child.stdout!.on('data', (chunk: Buffer) => {
      process.stdout.write(chunk);
      out.push(chunk.toString());
    });
    child.on('error', reject);
    child.on('exit', (c, signal) => resolve(c ?? (signal ? 128 : 1)));
  });
  const text = out.join('');
  const m = new RegExp(`^${label}: (\\d+) passed, (\\d+) failed$`, 'm').exec(text);
  if (!m) return { name, passed: 0, failed: 1, failures: [`${name}: no closing count (exit code ${code})`] };
  const failed = Number(m[2]) + (code !== 0 && Number(m[2]) === 0 ? 1 : 0);
  // Lines the suite marks FAIL name what failed.
  const failures = text
    .split('\n')
    .filter((l) => /^FAIL\b/.test(l.trim()))
    .map((l) => `${name}: ${l.trim().slice(0, 300)}`);
  if (failed > 0 && failures.length === 0) failures.push(`${name}: exit code ${code}`);
  return { name, passed: Number(m[1]), failed, failures };
}

/** Runs a Jest or Vitest suite that writes a Jest-style JSON report, and counts its tests. */
async function suite(
  name: string,
  cmd: string,
  args: string[],
  report: string,
  env: NodeJS.ProcessEnv,
): Promise<SuiteResult> {
  console.log(`\n── ${name}`);
  rmSync(report, { force: true });
  const code = await runInherit(cmd, args, { cwd: REPO, env });
  if (!existsSync(report))
    return { name, passed: 0, failed: 1, failures: [`${name}: no report (exit code ${code})`] };
  const json = JSON.parse(readFileSync(report, 'utf8')) as JestReport;
  const failed = json.numFailedTests + (code !== 0 && json.numFailedTests === 0 ? 1 : 0);
  const failures = failedTests(json);
  if (failed > 0 && failures.length === 0) failures.push(`exit code ${code}`);
  return { name, passed: json.numPassedTests, failed, failures: failures.map((f) => `${name}: ${f}`) };
}

interface JestReport {
  numPassedTests: number;
  numFailedTests: number;
  testResults?: {
    name: string;
    status?: string;
    message?: string;
    assertionResults?: { fullName?: string; title?: string; status: string; failureMessages?: string[] }[];
  }[];
}

/** One line per failed test (file, test name, the first line of its message), from a Jest-style report. */
function failedTests(json: JestReport): string[] {
  const firstLine = (text: string | undefined) =>
    (text ?? '')
      .split('\n')
      .find((l) => l.trim() !== '')
      ?.trim()
      .slice(0, 300) ?? '';
  const lines: string[] = [];
  for (const file of json.testResults ?? []) {
    const where = relative(REPO, file.name);
    const failedHere = (file.assertionResults ?? []).filter((a) => a.status === 'failed');
    for (const a of failedHere)
      lines.push(`${where} › ${a.fullName ?? a.title ?? '?'} — ${firstLine(a.failureMessages?.[0])}`);
    if (failedHere.length === 0 && file.status === 'failed')
      lines.push(`${where} — ${firstLine(file.message)}`);
  }
  return lines;
}

async function main(): Promise<void> {
  onShutdown(async () => {
    await stopChildren();
    cleanup();
  });
  mkdirSync(resultsDir, { recursive: true });

  if (!quick && !existsSync('/usr/bin/chromium')) aptInstall(['chromium'], 'the browser tests');
  // The tag tests rasterise PDFs with poppler's pdftoppm; they run in the quick suite too.
  if (!existsSync('/usr/bin/pdftoppm')) aptInstall(['poppler-utils'], 'the tag PDF tests');

  let target: PgTarget;
  if (process.env.PGHOST) {
    // An outside server: the suites create (and drop) only databases of their own there.
    target = {
      host: process.env.PGHOST,
      port: Number(process.env.PGPORT ?? 5432),
      user: process.env.PGUSER ?? 'postgres',
      password: process.env.PGPASSWORD ?? '',
      database: process.env.PGDATABASE ?? 'postgres',
    };
  } else {
    rmSync(join(DATA_DIR, 'test-pg'), { recursive: true, force: true });
    const port = await freePort();
    console.log(`starting a throw-away PostgreSQL on 127.0.0.1:${port}…`);
    cluster = await startPrivateCluster({
      base: join(DATA_DIR, 'test-pg'),
      port,
      durable: false,
      appUser: 'beadroll_test',
      database: 'beadroll_test',
      createdb: true,
    });
    target = cluster.target;
  }
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(target),
    BEADROLL_TEST_PG_SUPERUSER: target.superuser?.user ?? '',
    BEADROLL_TEST_PG_SUPERPASSWORD: target.superuser?.password ?? '',
    NODE_ENV: 'test',
  };
  delete env.PORT;

  const results: SuiteResult[] = [];
  const build = await step('build', 'npm', ['run', '--silent', 'build']);
  results.push(build);
  results.push(
    await step("web API types match the server's OpenAPI document", 'npx', [
      'tsx',
      'tools/gen-api.ts',
      '--check',
    ]),
  );
  results.push(await step('lint (eslint)', 'npx', ['eslint', '.']));
  results.push(await step('format (prettier)', 'npx', ['prettier', '--check', '.']));
  results.push(await step('type check', 'npm', ['run', '--silent', 'typecheck']));
  results.push(await step('type check (tools)', 'npx', ['tsc', '-p', 'tools/tsconfig.json']));
  const report = (name: string) => join(resultsDir, `${name}.json`);
  results.push(
    await suite(
      'core',
      'npx',
      [
        'vitest',
        'run',
        '--root',
        'packages/core',
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${report('core')}`,
      ],
      report('core'),
      env,
    ),
  );
  results.push(
    await suite(
      'verifier',
      'npx',
      [
        'vitest',
        'run',
        '--root',
        'packages/verify',
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${report('verifier')}`,
      ],
      report('verifier'),
      // The quick suite has no browser: it leaves out the offline page's browser test.
      quick ? { ...env, VERIFY_SKIP_BROWSER: '1' } : env,
    ),
  );
  results.push(
    await suite(
      'server',
      'npx',
      [
        'jest',
        '--rootDir',
        'packages/server',
        '--config',
        'packages/server/jest.config.cjs',
        '--json',
        `--outputFile=${report('server')}`,
      ],
      report('server'),
      env,
    ),
  );
  results.push(
    await suite(
      'web',
      'npx',
      [
        'vitest',
        'run',
        '--root',
        'packages/web',
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${report('web')}`,
      ],
      report('web'),
      env,
    ),
  );
  if (!quick && build.failed === 0) {
    results.push(
      await suite(
        'browser',
        'npx',
        [
          'vitest',
          'run',
          '--config',
          'packages/web/vitest.browser.config.ts',
          '--reporter=default',
          '--reporter=json',
          `--outputFile.json=${report('browser')}`,
        ],
        report('browser'),
        env,
      ),
    );
    // The cluster test runs a primary and standby of its own, so it needs this machine's
    // PostgreSQL: skipped when the run uses an outside server.
    if (process.env.PGHOST) console.log('\n── cluster: skipped (PGHOST names an outside server)');
    else
      results.push(
        await counted('cluster', 'cluster', 'node_modules/.bin/tsx', ['tools/test-cluster.ts', '--built'], {
          ...process.env,
          NODE_ENV: 'test',
        }),
      );
  }

  await stopChildren();
  cleanup();
  const passed = results.reduce((n, r) => n + r.passed, 0);
  const failed = results.reduce((n, r) => n + r.failed, 0);
  console.log('');
  const failures = results.flatMap((r) => (r.failed ? (r.failures ?? []) : []));
  if (failures.length) {
    console.log('what failed:');
    for (const f of failures) console.log(`  ${f}`);
    console.log('');
  }
  for (const r of results)
    console.log(`  ${r.failed ? '✗' : '✓'} ${r.name}: ${r.passed} passed, ${r.failed} failed`);
  console.log(`tests: ${passed} passed, ${failed} failed`);
  process.exit(failed > 0 || passed === 0 ? 1 : 0);
}

main().catch(async (err: unknown) => {
  console.error(err instanceof UserFacingError ? `npm test: ${err.message}` : err);
  await stopChildren();
  cleanup();
  console.log('tests: 0 passed, 1 failed');
  process.exit(1);
});
