import { sha256HexOfBytes } from '@beadroll/core';
import { Caption1, makeStyles, Spinner, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';

type State = { status: 'loading' } | { status: 'ok'; url: string } | { status: 'mismatch' | 'failed' };

const useStyles = makeStyles({
  img: { display: 'block', maxWidth: '100%', height: 'auto' },
  problem: { color: tokens.colorPaletteRedForeground1, padding: tokens.spacingHorizontalS },
});

/**
 * Shows an image only after its bytes have been hashed in the browser and match the SHA-256
 * the roll lists for it; a swapped or damaged file is reported instead of shown.
 */
export function VerifiedImage({
  src,
  sha256,
  alt,
  className,
}: {
  src: string;
  sha256: string;
  alt: string;
  className?: string;
}) {
  const styles = useStyles();
  const [state, setState] = useState<State>({ status: 'loading' });
  useEffect(() => {
    const ctrl = new AbortController();
    let url: string | undefined;
    setState({ status: 'loading' });
    fetch(src, { credentials: 'same-origin', signal: ctrl.signal })
      .then(async (res) => {
        if (!res.ok) throw new Error(String(res.status));
        const bytes = new Uint8Array(await res.arrayBuffer());
        if (sha256HexOfBytes(bytes) !== sha256) return setState({ status: 'mismatch' });
        url = URL.createObjectURL(new Blob([bytes], { type: res.headers.get('content-type') ?? '' }));
        setState({ status: 'ok', url });
      })
      .catch((e: unknown) => {
        if ((e as Error).name !== 'AbortError') setState({ status: 'failed' });
      });
    return () => {
      ctrl.abort();
      if (url) URL.revokeObjectURL(url);
    };
  }, [src, sha256]);

  if (state.status === 'loading') return <Spinner size="tiny" label="Checking the image" />;
  if (state.status === 'mismatch')
    return (
      <Caption1 role="alert" className={styles.problem}>
        This file does not match the SHA-256 on the roll, so it is not shown.
      </Caption1>
    );
  if (state.status !== 'ok')
    return <Caption1 className={styles.problem}>The image could not be loaded.</Caption1>;
  return (
    <img
      src={state.url}
      alt={alt}
      className={className ?? styles.img}
      data-sha256={sha256}
      data-verified="true"
    />
  );
}
