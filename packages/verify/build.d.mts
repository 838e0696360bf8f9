/** Path of the built command line (dist/beadroll-verify.mjs). */
export const CLI_FILE: string;
/** Path of the built offline page (dist/verify.html). */
export const PAGE_FILE: string;
/** True when an output is missing or older than a source it is built from. */
export function isStale(): boolean;
/** The page's content security policy for the given built HTML. */
export function pagePolicy(html: string): string;
/** Builds the command line and the page. */
export function buildVerifier(): Promise<void>;
