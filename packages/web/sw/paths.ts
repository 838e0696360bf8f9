/** Addresses the dealer app's pages never cover: the public lot pages, the API, the server's own pages. */
export const SERVER_PATHS: RegExp[] = [/^\/l\//i, /^\/api(\/|$)/, /^\/dev\//, /^\/verify(\/|$)/];

/** The public data of one lot and its bundle: `/api/public/lots/{code}` and `…/bundle`. */
export const LOT_DATA = /^\/api\/public\/lots\/[^/]+(\/bundle)?$/;

/** The files of a lot's exhibits (photos); their bytes never change for a given entry. */
export const LOT_EXHIBIT = /^\/api\/public\/lots\/[^/]+\/(inherited\/[^/]+\/)?exhibits\/\d+\/(web|thumb)$/;

/** Response header the lot worker adds to an answer it gives from its saved copy. */
export const SAVED_COPY_HEADER = 'Beadroll-Saved-Copy';

/** The data block in which the server sends a listed lot's public data with its page. */
export const LOT_DATA_BLOCK = /<script type="application\/json" id="lot-data">([^<]*)<\/script>/;
