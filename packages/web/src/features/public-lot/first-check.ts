import { checkLot } from './check-lot';
import { embeddedLot } from './embedded';
import { writeHistoryLine } from './history-words';
import { parsePublicPath } from './route';
import type { PublicLotResponse } from './public-lot.api';

/**
 * The first thing the public page does: when the server sent the lot's data and its rendered
 * history with the page, checks that history with core's verifier and writes the verdict into
 * the rendered status panel. Returns the data (null when the page came without it: it is then
 * fetched), the very object the rest of the page renders, so its check is not run twice.
 */
export function firstCheck(pathname: string, doc: Document = document): PublicLotResponse | null {
  const route = parsePublicPath(pathname);
  const data = route ? embeddedLot(route.code, doc) : null;
  const live = doc.querySelector('#root .pl-status-live');
  if (route && data && live) writeHistoryLine(live, checkLot(route.code, data.bundle));
  return data;
}
