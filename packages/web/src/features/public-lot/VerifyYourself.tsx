import { formatLotCode, printedTagCode, tagReference, type RollHead } from '@beadroll/core';
import { publicBundlePath } from './public-lot.api';

/** Where the offline verifier lives: a page that checks a downloaded history without the network. */
export const VERIFIER_PATH = '/verify';

/** How to check the same history without this page. */
export function VerifyYourself({ code, head }: { code: string; head: RollHead | null }) {
  const file = `${code}.beadroll.json`;
  const ref = head ? tagReference(head.hash) : null;
  return (
    <section className="pl-section pl-verify" aria-labelledby="pl-verify-h">
      <h2 id="pl-verify-h">Verify it yourself</h2>
      <ol className="pl-verify-steps">
        <li>
          <a href={publicBundlePath(code)} download={file}>
            Download the history of lot {formatLotCode(code)}
          </a>{' '}
          ({file}) and keep it.
        </li>
        <li>
          Open <a href={VERIFIER_PATH}>Beadroll’s offline verifier</a> and give it the file: it checks every
          entry on your own device, with no connection needed.
        </li>
      </ol>
      <p className="pl-hint">
        The ledger format is published, so anyone can also check the file with a verifier of their own.
        {head && ref && (
          <>
            {' '}
            The newest entry served is entry {head.seq}, code{' '}
            <span className="pl-nowrap">{printedTagCode(ref)}</span>.
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
