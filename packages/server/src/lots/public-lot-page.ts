import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Logger, type INestApplicationContext } from '@nestjs/common';
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
    const at = html.lastIndexOf('</body>');
    if (at < 0) return null;
    const markup = html.includes(EMPTY_ROOT) ? await rendered(pathname, text) : null;
    const page = `${html.slice(0, at)}${lotDataBlock(text)}${html.slice(at)}`;
    return markup === null ? page : page.replace(EMPTY_ROOT, () => `<div id="root">${markup}</div>`);
  };
}
