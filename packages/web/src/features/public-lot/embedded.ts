// Kept apart from public-lot.api (no query library): the page's first script reads it.
import type { PublicLotResponse } from './public-lot.api';

/** The id of the element in which the server sends a listed lot's public data with its page. */
export const LOT_DATA_ELEMENT = 'lot-data';

/**
 * The lot's public data the server wrote into the page (the same JSON the API answers for the
 * lot), when it is there and names `code`; null otherwise (the page then asks the API). It is
 * raw data like the API's answer: the page checks it the same way before showing it as verified.
 */
export function embeddedLot(code: string, doc: Document = document): PublicLotResponse | null {
  const text = doc.getElementById(LOT_DATA_ELEMENT)?.textContent;
  if (!text) return null;
  try {
    const data = JSON.parse(text) as PublicLotResponse | null;
    return data && typeof data === 'object' && data.code === code ? data : null;
  } catch {
    return null;
  }
}
