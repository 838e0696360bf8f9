import { spawn, spawnSync, type ChildProcess, type SpawnOptions } from 'node:child_process';
import { createServer } from 'node:net';

/** A failure the user can act on: printed as one line, without a stack. */
export class UserFacingError extends Error {}

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/** Runs a command to completion; throws with its output when it fails. */
export function run(cmd: string, args: string[], opts: SpawnOptions & { quiet?: boolean } = {}): string {
  const result = spawnSync(cmd, args, { encoding: 'utf8', ...opts, stdio: opts.quiet ? 'pipe' : opts.stdio });
  if (result.error) throw result.error;
  if (result.status !== 0) {
    const out = `${result.stdout ?? ''}${result.stderr ?? ''}`.trim();
    throw new Error(`${cmd} ${args.join(' ')} exited with ${result.status}${out ? `:\n${out}` : ''}`);
  }
  return String(result.stdout ?? '');
}

/** Runs a command with inherited output; resolves with its exit code. */
export function runInherit(cmd: string, args: string[], opts: SpawnOptions = {}): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: 'inherit', ...opts });
    track(child);
    child.on('error', reject);
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 128 : 1)));
  });
}

/** True when something already listens on host:port. */
export function portInUse(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = createServer();
    probe.once('error', () => resolve(true));
    probe.once('listening', () => probe.close(() => resolve(false)));
    probe.listen(port, host);
  });
}

/** A port that was free a moment ago. */
export function freePort(host = '127.0.0.1'): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, host, () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

const children = new Set<ChildProcess>();

/** Remembers a child so that stopAll() ends it. */
export function track(child: ChildProcess): ChildProcess {
  children.add(child);
  child.on('exit', () => children.delete(child));
  return child;
}

/** Sends SIGTERM to every tracked child and waits (up to 10 s) for them to exit. */
export async function stopChildren(): Promise<void> {
  await Promise.all(
    [...children].map(
      (child) =>
        new Promise<void>((resolve) => {
          if (child.exitCode !== null || child.signalCode !== null) return resolve();
          const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
          child.once('exit', () => {
            clearTimeout(timer);
            resolve();
          });
          child.kill('SIGTERM');
        }),
    ),
  );
}

/** Calls `cleanup` once on exit, SIGINT or SIGTERM, then exits with the given code. */
export function onShutdown(cleanup: () => Promise<void>): void {
  let done = false;
  const handler = (signal: NodeJS.Signals) => {
    if (done) return;
    done = true;
    console.log(`\n${signal}: stopping…`);
    cleanup()
      .catch((err: unknown) => console.error(err))
      .finally(() => process.exit(signal === 'SIGINT' ? 130 : 143));
  };
  process.on('SIGINT', handler);
  process.on('SIGTERM', handler);
}

/** Waits until `check` resolves true, polling, or throws after `timeoutMs`. */
export async function waitFor(check: () => Promise<boolean>, timeoutMs: number, what: string): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new UserFacingError(`timed out after ${timeoutMs / 1000}s waiting for ${what}`);
}

/** Installs Debian packages (apt-get, as root or through sudo) with a clear message when impossible. */
export function aptInstall(packages: string[], why: string): void {
  const sudo = isRoot ? [] : ['sudo', '-n'];
  if (!isRoot && spawnSync('sudo', ['-n', 'true']).status !== 0) {
    throw new UserFacingError(
      `${why} needs the Debian package(s) ${packages.join(', ')}, and installing them needs root. ` +
        `Run: sudo apt-get install -y ${packages.join(' ')}`,
    );
  }
  if (spawnSync('which', ['apt-get']).status !== 0) {
    throw new UserFacingError(`${why} needs ${packages.join(', ')}, but apt-get is not available here.`);
  }
  console.log(`installing ${packages.join(', ')} from Debian's packages (${why})…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const [cmd, ...pre] = sudo.length ? sudo : ['apt-get'];
  const base = sudo.length ? [...pre, 'apt-get'] : [];
  try {
    run(cmd, [...base, 'update', '-qq'], { quiet: true, env });
    run(cmd, [...base, 'install', '-y', '-qq', '--no-upgrade', ...packages], { quiet: true, env });
  } catch (err) {
    throw new UserFacingError(
      `could not install ${packages.join(', ')} with apt-get: ${(err as Error).message.split('\n').slice(-3).join(' ')}`,
    );
  }
}
