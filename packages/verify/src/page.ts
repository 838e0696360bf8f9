// The offline verifier page: reads a dropped or chosen file on this device and shows core's
// verdict for every roll. It makes no network request of any kind.
import { DEFAULT_MAX_BUNDLE_BYTES, sha256HexOfBytes, type VerifierKey } from '@beadroll/core';
import { readLogKey, reportBundleBytes, type Report } from './report.js';

const VERDICT: Record<Report['exitCode'], string> = {
  0: 'Intact: every roll is unbroken and every link checks both ways.',
  1: 'Broken: this file holds a history that does not check out.',
  2: 'Not a lot history file: nothing in it could be checked.',
};

const INTACT_WITH_NOTES =
  'Intact as far as it can be checked: nothing is broken, but some of it could not be checked. Read the notes below before relying on it.';

function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attrs: Record<string, string> = {},
  ...children: Array<Node | string>
): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, v);
  for (const c of children) e.append(c);
  return e;
}

function sizeWords(n: number): string {
  if (n < 1024) return `${n} bytes`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / 1024 / 1024).toFixed(1)} MiB`;
}

/** The checkpoints of the public log, as checked with the log's key, or how many were not checked. */
function checkpointParts(report: Report, keyProblem: string | null): Node[] {
  const parts: Node[] = [];
  if (keyProblem) parts.push(el('p', { class: 'v-detail' }, `The log key was not used: ${keyProblem}.`));
  if (report.checkpoints.length > 0) {
    const list = el('ul', { class: 'v-rolls', 'aria-label': 'Checkpoints of the public log' });
    for (const c of report.checkpoints) {
      const item = el(
        'li',
        { class: 'v-roll v-checkpoint', 'data-ok': String(c.ok) },
        el(
          'div',
          { class: 'v-roll-head' },
          el('span', { class: 'v-code' }, c.size === null ? 'Checkpoint' : `Checkpoint of ${c.size} entries`),
          el('span', { class: 'v-state' }, c.ok ? 'checks with the log’s key' : 'broken'),
        ),
      );
      if (c.message) item.append(el('p', { class: 'v-detail' }, c.message));
      for (const i of c.inclusions)
        item.append(
          el(
            'p',
            { class: i.ok ? 'v-meta' : 'v-detail' },
            `Lot ${i.code}, entry ${i.seq}, at log index ${i.logIndex}: ${i.ok ? 'in the log' : `not shown in the log — ${i.message}`}`,
          ),
        );
      list.append(item);
    }
    parts.push(el('h2', {}, 'Public log'), list);
  } else if (report.uncheckedCheckpoints > 0)
    parts.push(
      el(
        'p',
        { class: 'v-meta' },
        `The file carries ${report.uncheckedCheckpoints === 1 ? 'a checkpoint' : `${report.uncheckedCheckpoints} checkpoints`} of the registry's public log; give the log key above to check ${report.uncheckedCheckpoints === 1 ? 'it' : 'them'} too.`,
      ),
    );
  return parts;
}

/** Renders a report; every text goes in as text, never as markup. */
function render(
  target: HTMLElement,
  name: string,
  bytes: Uint8Array,
  report: Report,
  keyProblem: string | null = null,
): void {
  const parts: Node[] = [];
  parts.push(el('h2', {}, 'Result'));
  const noted =
    report.notes.length > 0 || report.rolls.some((r) => r.notes.length > 0 || r.unchecked.length > 0);
  parts.push(
    el(
      'p',
      { class: 'v-verdict', 'data-exit': String(report.exitCode), 'data-noted': String(noted) },
      report.exitCode === 0 && noted ? INTACT_WITH_NOTES : VERDICT[report.exitCode],
    ),
  );
  parts.push(
    el(
      'p',
      { class: 'v-meta' },
      `${name}, ${sizeWords(bytes.length)}. SHA-256 of the file: `,
      el('code', {}, sha256HexOfBytes(bytes)),
    ),
  );
  if (report.unreadable) {
    parts.push(el('p', { class: 'v-detail' }, `${report.unreadable.code}: ${report.unreadable.message}`));
  } else {
    if (report.summary) parts.push(el('p', { class: 'v-meta' }, report.summary));
    const list = el('ul', { class: 'v-rolls', 'aria-label': 'Rolls in the file' });
    for (const r of report.rolls) {
      const what =
        r.scope === 'link' ? 'link entries only' : `${r.entries} ${r.entries === 1 ? 'entry' : 'entries'}`;
      const item = el(
        'li',
        {
          class: 'v-roll',
          'data-ok': String(r.ok),
          'data-lot': r.lot ?? '',
          'data-partial': String(r.unchecked.length > 0),
        },
        el(
          'div',
          { class: 'v-roll-head' },
          el('span', { class: 'v-code' }, `Lot ${r.code}`),
          el(
            'span',
            { class: 'v-state' },
            !r.ok
              ? 'broken'
              : r.unchecked.length > 0
                ? 'intact, not fully checkable after a removal'
                : r.notes.length > 0
                  ? 'intact, with a note'
                  : 'intact',
          ),
          el('span', {}, `${what}${r.status ? `, ${r.status}` : ''}`),
        ),
      );
      if (r.problem) {
        item.append(
          el(
            'p',
            { class: 'v-detail' },
            r.problem.seq === null ? '' : `At entry ${r.problem.seq}: `,
            el('code', { class: 'v-reason' }, r.problem.reason),
            ` — ${r.problem.message}`,
          ),
        );
      }
      for (const u of r.unchecked)
        item.append(
          el(
            'p',
            { class: 'v-note' },
            `${u.seq === null ? '' : `At entry ${u.seq}: `}could not check ${u.message}. A removal took away what this rule needs.`,
          ),
        );
      for (const n of r.notes) item.append(el('p', { class: 'v-note' }, n));
      list.append(item);
    }
    parts.push(list);
    for (const p of report.problems) {
      parts.push(
        el(
          'p',
          { class: 'v-detail' },
          'The file as a whole: ',
          el('code', { class: 'v-reason' }, p.reason),
          ` — ${p.message}`,
        ),
      );
    }
    for (const n of report.notes) parts.push(el('p', { class: 'v-note' }, n));
    parts.push(...checkpointParts(report, keyProblem));
  }
  parts.push(el('p', { class: 'v-meta' }, `In one line: ${report.headline}`));
  target.replaceChildren(...parts);
  target.hidden = false;
  target.dataset.exit = String(report.exitCode);
}

async function check(file: File, target: HTMLElement): Promise<void> {
  target.hidden = false;
  target.replaceChildren(el('p', {}, `Checking ${file.name}…`));
  const bytes = new Uint8Array(await file.arrayBuffer());
  const keyText = (document.getElementById('logkey') as HTMLInputElement).value.trim();
  let logKey: VerifierKey | undefined;
  let keyProblem: string | null = null;
  if (keyText)
    try {
      logKey = readLogKey(keyText);
    } catch (e) {
      keyProblem = (e as Error).message;
    }
  render(target, file.name, bytes, reportBundleBytes(bytes, DEFAULT_MAX_BUNDLE_BYTES, logKey), keyProblem);
}

function start(): void {
  // Served by a Beadroll server, the page offers itself as a download; a saved copy does not.
  if (location.protocol === 'http:' || location.protocol === 'https:')
    document.getElementById('save')!.hidden = false;
  const input = document.getElementById('file') as HTMLInputElement;
  const drop = document.getElementById('drop')!;
  const result = document.getElementById('result')!;
  input.addEventListener('change', () => {
    const f = input.files?.[0];
    if (f) void check(f, result);
  });
  // The whole window takes a drop, so a file let go anywhere is checked rather than opened.
  window.addEventListener('dragover', (e) => {
    e.preventDefault();
    drop.classList.add('v-over');
  });
  window.addEventListener('dragleave', (e) => {
    if (e.relatedTarget === null) drop.classList.remove('v-over');
  });
  window.addEventListener('drop', (e) => {
    e.preventDefault();
    drop.classList.remove('v-over');
    const f = e.dataTransfer?.files[0];
    if (f) void check(f, result);
  });
}

start();
