import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliCompress, brotliCompressSync, constants } from 'node:zlib';
import { pathToFileURL } from 'node:url';
import { Logger, type INestApplicationContext } from '@nestjs/common';
import type { Response } from 'express';
import { PublicLotsService } from './public-lots.service';

/** The id of the element that carries a listed lot's public data inside its page. */
export const LOT_DATA_ELEMENT = 'lot-data';

/** The page's root element as built: the rendered history goes inside it. */
const EMPTY_ROOT = '<div id="root"></div>';

/** Data larger than this is left to the browser alone: rendering it here would hold the server up. */
const MAX_RENDERED_BYTES = 256 * 1024;

/** Rendered pages kept, newest last (a listed lot's page is asked for again and again at a fair). */
const KEPT_RENDERINGS = 100;

/** The web build's renderer of the public page (`packages/web/src/public-ssr.tsx`). */
type RenderPage = (pathname: string, text: string) => string;

/**
 * The lot's public data as a JSON data block for an HTML page. `<` is written as `\u003c`, the
 * same string to a JSON reader, so no text inside can end the element or open a comment.
 */
export function lotDataBlock(text: string): string {
  return `<script type="application/json" id="${LOT_DATA_ELEMENT}">${text.replace(/</g, '\\u003c')}</script>`;
}

/**
 * The Content-Security-Policy sources (`'sha256-…'`) of the inline scripts the built public page
 * carries (its first script, which checks the lot: see the web build's first-script.ts), so the
 * browser runs those and no other inline script. Empty when there is no built page.
 */
export function publicPageScriptHashes(webDist: string): string[] {
  const file = join(webDist, 'public.html');
  if (!existsSync(file)) return [];
  const html = readFileSync(file, 'utf8');
  return [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)]
    .filter(([, attrs]) => !/\bsrc=/.test(attrs!) && !/type="application\/json"/.test(attrs!))
    .map(([, , text]) => `'sha256-${createHash('sha256').update(text!).digest('base64')}'`);
}

/** Loads the renderer the web build writes beside its output folder; null when there is none. */
async function loadRenderer(webDist: string, logger: Logger): Promise<RenderPage | null> {
  const file = join(webDist, '..', 'dist-ssr', 'public-ssr.js');
  if (!existsSync(file)) return null;
  try {
    const mod = (await import(pathToFileURL(file).href)) as { renderPublicLotPage?: RenderPage };
    return mod.renderPublicLotPage ?? null;
  } catch (err) {
    logger.warn(`The public page is served without its server rendering: ${(err as Error).message}`);
    return null;
  }
}

/**
 * Writes the public data of a listed lot into its page, so the page has what it checks without
 * asking again: the same text `GET /api/public/lots/{code}` answers, read the same way. When the
 * web build's renderer is there, the page's history is rendered into it too, so it paints before
 * any script runs; the page's script checks the data and gives the verdict. For any code that is
 * not a listed lot, and when the read fails, the answer is null and the page is served as it was
 * built (it then asks the API itself, which gives the one bare 404), so the page tells nothing
 * more about a code than the API does.
 */
export function publicLotPage(app: INestApplicationContext, webDist: string) {
  const lots = app.get(PublicLotsService, { strict: false });
  const logger = new Logger('PublicLotPage');
  let renderer: Promise<RenderPage | null> | null = null;
  const kept = new Map<string, string>();

  const rendered = async (pathname: string, text: string): Promise<string | null> => {
    if (text.length > MAX_RENDERED_BYTES) return null;
    renderer ??= loadRenderer(webDist, logger);
    const render = await renderer;
    if (!render) return null;
    const key = `${pathname}\n${createHash('sha256').update(text).digest('hex')}`;
    let markup = kept.get(key);
    if (markup === undefined) {
      try {
        markup = render(pathname, text);
      } catch (err) {
        logger.warn(`A public page could not be rendered on the server: ${(err as Error).message}`);
        return null;
      }
    }
    kept.delete(key);
    kept.set(key, markup);
    if (kept.size > KEPT_RENDERINGS) kept.delete(kept.keys().next().value!);
    return markup;
  };

  return async (html: string, pathname: string, code: string, signedIn: boolean): Promise<string | null> => {
    let text: string;
    try {
      text = (await lots.lotRead(code, signedIn)).answer.text;
    } catch {
      return null;
    }
    // The data goes right after the page's root, ahead of the first script, which reads it.
    const root = html.indexOf(EMPTY_ROOT);
    if (root < 0) {
      const at = html.lastIndexOf('</body>');
      return at < 0 ? null : `${html.slice(0, at)}${lotDataBlock(text)}${html.slice(at)}`;
    }
    const markup = (await rendered(pathname, text)) ?? '';
    const rest = html.slice(root + EMPTY_ROOT.length);
    return `${html.slice(0, root)}<div id="root">${markup}</div>${lotDataBlock(text)}${rest}`;
  };
}

/** Brotli copies of public pages kept, newest last. */
const KEPT_COMPRESSED = 100;

/**
 * Sends public pages brotli-compressed for browsers that accept it. A page carries the lot's
 * data and its first script (about 90 KB before compression), and the same page is asked for
 * again and again at a fair. Each page text is compressed at once at quality 5 (a few
 * milliseconds) and kept, by a digest of its text; when it is asked for a second time, it is
 * compressed again at quality 11 (about a tenth smaller; a fifth of a second, on the thread pool,
 * one page at a time, so a busy ledger whose pages change often costs at most one thread), and
 * that copy replaces the first. The ETag names the page's text, the same for either copy, so a
 * browser holding one gets a 304 for the other. Returns false (nothing sent) when the browser
 * does not take brotli: the page then goes the ordinary way.
 */
export function publicPageSender() {
  const kept = new Map<string, { body: Buffer; best: boolean }>();
  let making: string | null = null;
  const keep = (key: string, copy: { body: Buffer; best: boolean }) => {
    kept.delete(key);
    kept.set(key, copy);
    if (kept.size > KEPT_COMPRESSED) kept.delete(kept.keys().next().value!);
  };
  const makeBest = (key: string, page: string) => {
    making = key;
    brotliCompress(page, { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }, (err, body) => {
      making = null;
      if (!err && kept.has(key)) keep(key, { body, best: true });
    });
  };
  return (acceptEncoding: string | undefined, res: Response, page: string): boolean => {
    if (!/\bbr\b/.test(acceptEncoding ?? '')) return false;
    const key = createHash('sha256').update(page).digest('base64url');
    let copy = kept.get(key);
    if (!copy) {
      const body = brotliCompressSync(page, { params: { [constants.BROTLI_PARAM_QUALITY]: 5 } });
      copy = { body, best: false };
    } else if (!copy.best && making === null) makeBest(key, page);
    keep(key, copy);
    res.setHeader('ETag', `W/"${key.slice(0, 27)}"`);
    res.setHeader('Content-Encoding', 'br');
    res.vary('Accept-Encoding');
    res.type('html').send(copy.body);
    return true;
  };
}
