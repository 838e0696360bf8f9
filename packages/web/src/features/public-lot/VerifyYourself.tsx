import { formatLotCode, tagReference, type RollHead } from '@beadroll/core';
import { publicBundlePath } from './public-lot.api';

/** The offline checking page the server serves (one self-contained HTML file). */
export const VERIFY_PAGE_PATH = '/verify';
export const VERIFY_PAGE_DOWNLOAD_PATH = '/verify/download';

/** How to check the same history without this page. */
export function VerifyYourself({ code, head }: { code: string; head: RollHead | null }) {
  const file = `${code}.beadroll.json`;
  const ref = head ? tagReference(head.hash) : null;
  return (
    <section className="pl-section pl-verify" aria-labelledby="pl-verify-h">
      <h2 id="pl-verify-h">Verify it yourself</h2>
      <ol className="pl-steps">
        <li>
          <a href={publicBundlePath(code)} download={file}>
            Download the history of lot {formatLotCode(code)}
          </a>{' '}
          ({file}).
        </li>
        <li>
          Open <a href={VERIFY_PAGE_PATH}>Beadroll’s checking page</a> and choose the file there (or drop it
          on the page). It checks the file on your own device, even with no connection, and shows each roll as
          intact or broken.{' '}
          <a href={VERIFY_PAGE_DOWNLOAD_PATH} download="beadroll-verify.html">
            Keep a copy of the checking page
          </a>{' '}
          to check files later without this site.
        </li>
      </ol>
      <p className="pl-hint">
        The ledger format is published, so you can also check the file with code of your own.
        {head && ref && (
          <>
            {' '}
            The newest entry served is entry {head.seq}, reference{' '}
            <span className="pl-nowrap">
              {ref.slice(0, 5)}-{ref.slice(5)}
            </span>
            .
          </>
        )}
      </p>
      <p className="pl-hint">
        What this proves: every entry is unchanged since it was written and links to the one before, and the
        entry your tag was printed at is still there. It does not prove an opinion right, and a whole history
        rewritten before anyone kept a tag or a copy would also check out; keep the downloaded file to compare
        later.
      </p>
    </section>
  );
}
