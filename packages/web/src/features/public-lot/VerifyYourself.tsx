import { formatLotCode, tagReference, type RollHead } from '@beadroll/core';
import { publicBundlePath } from './public-lot.api';

/** How to check the same history without this page. */
export function VerifyYourself({ code, head }: { code: string; head: RollHead | null }) {
  const file = `${code}.beadroll.json`;
  const ref = head ? tagReference(head.hash) : null;
  return (
    <section className="pl-section pl-verify" aria-labelledby="pl-verify-h">
      <h2 id="pl-verify-h">Verify it yourself</h2>
      <p>
        <a href={publicBundlePath(code)} download={file}>
          Download the history of lot {formatLotCode(code)}
        </a>{' '}
        ({file}), then check it offline with Beadroll’s verifier:
      </p>
      <pre className="pl-cmd">
        <code>npm run verify -- {file}</code>
      </pre>
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
