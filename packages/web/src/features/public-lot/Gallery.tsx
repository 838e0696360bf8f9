import {
  formatLotCode,
  sha256HexOfBytes,
  uvCaution,
  type ExhibitAddedBody,
  type ExhibitFile,
  type ExhibitRef,
  type VerifiedEntry,
} from '@beadroll/core';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import {
  exhibitBytesQuery,
  type DealerCard,
  type ExhibitSource,
  type ExhibitVariant,
} from './public-lot.api';
import { nameOf } from './timeline';
import { dateWords, EXHIBIT_WORDS } from './words';

/** An exhibit on the roll that still has its body (not removed by the registrar). */
export interface ShownExhibit {
  seq: number;
  time: string;
  actor: string;
  exhibit: ExhibitRef;
  /** Set for an exhibit recorded on an ancestor lot. */
  from?: ExhibitSource;
}

/** Public exhibits of the verified entries, oldest first. */
export function exhibitsOf(entries: VerifiedEntry[]): ShownExhibit[] {
  const out: ShownExhibit[] = [];
  for (const e of entries) {
    const b = e.body as ExhibitAddedBody | null;
    if (e.header.kind === 'exhibit-added' && b && 'exhibit' in b)
      out.push({ seq: e.header.seq, time: e.header.time, actor: e.header.actor, exhibit: b.exhibit });
  }
  return out;
}

const IMAGE_TYPES = /^image\/(jpeg|png|webp|gif|avif)$/;

/**
 * The file a page shows for an exhibit: the web-sized derivative, else the thumbnail, else the
 * original when it is an image. Each comes with the SHA-256 the roll recorded for it.
 */
export function displayFile(x: ExhibitRef): { variant: ExhibitVariant; file: ExhibitFile } | null {
  const web = x.derivatives.find((d) => d.role === 'web' && IMAGE_TYPES.test(d.mediaType));
  if (web) return { variant: 'web', file: web };
  const thumb = x.derivatives.find(
    (d) => (d.role === 'thumbnail' || d.role === 'thumb') && IMAGE_TYPES.test(d.mediaType),
  );
  if (thumb) return { variant: 'thumb', file: thumb };
  if (IMAGE_TYPES.test(x.original.mediaType)) return { variant: 'original', file: x.original };
  return null;
}

/** The exhibits to show of lot `code`, and the cards of the accounts that added them. */
interface ExhibitsProps {
  code: string;
  exhibits: ShownExhibit[];
  cards: Record<string, DealerCard>;
}

export function Gallery({ code, exhibits, cards }: ExhibitsProps) {
  if (exhibits.length === 0) return null;
  return (
    <section className="pl-section pl-gallery" aria-labelledby="pl-gallery-h">
      <h2 id="pl-gallery-h">Evidence</h2>
      <p className="pl-hint">
        Each image is shown only after this browser has checked it against the fingerprint on the roll.
      </p>
      <ExhibitList code={code} exhibits={exhibits} cards={cards} />
    </section>
  );
}

/** Exhibits as checked figures, without a section around them. */
export function ExhibitList({ code, exhibits, cards }: ExhibitsProps) {
  return (
    <ul className="pl-gallery-list">
      {exhibits.map((x, i) => (
        <li key={`${x.from?.lot ?? code}/${x.seq}`}>
          <ExhibitFigure code={code} item={x} index={i + 1} cards={cards} />
        </li>
      ))}
    </ul>
  );
}

function ExhibitFigure({
  code,
  item,
  index,
  cards,
}: {
  code: string;
  item: ShownExhibit;
  index: number;
  cards: Record<string, DealerCard>;
}) {
  const { exhibit } = item;
  const shown = displayFile(exhibit);
  const label = exhibit.caption ?? `${EXHIBIT_WORDS[exhibit.kind]} ${index}`;
  return (
    <figure className="pl-figure">
      {shown ? (
        <CheckedImage
          code={code}
          seq={item.seq}
          variant={shown.variant}
          file={shown.file}
          alt={label}
          from={item.from}
        />
      ) : (
        <div className="pl-figure-frame pl-figure-note">
          A {EXHIBIT_WORDS[exhibit.kind]} ({exhibit.original.mediaType}) that this page does not display.
        </div>
      )}
      <figcaption>
        <span className="pl-figure-title">{exhibit.caption ?? `A ${EXHIBIT_WORDS[exhibit.kind]}`}</span>
        <span className="pl-figure-meta">
          {EXHIBIT_WORDS[exhibit.kind]} · added by {nameOf(cards, item.actor)} · {dateWords(item.time)} ·
          entry {item.seq}
          {item.from && item.from.lot !== code ? ` of lot ${formatLotCode(item.from.lot)}` : ''}
        </span>
        {exhibit.kind === 'uv-a' && (
          <span className="pl-caution">
            Taken under UV-A light. If you test beads this way: {uvCaution().text}
          </span>
        )}
      </figcaption>
    </figure>
  );
}

type ImageState = 'checking' | 'ok' | 'mismatch' | 'unavailable';

function CheckedImage({
  code,
  seq,
  variant,
  file,
  alt,
  from,
}: {
  code: string;
  seq: number;
  variant: ExhibitVariant;
  file: ExhibitFile;
  alt: string;
  from?: ExhibitSource;
}) {
  const q = useQuery(exhibitBytesQuery(code, seq, variant, from));
  const bytes = q.data ?? null;
  const matches = useMemo(
    () => (bytes ? sha256HexOfBytes(bytes) === file.sha256 : false),
    [bytes, file.sha256],
  );
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!bytes || !matches) return;
    const u = URL.createObjectURL(new Blob([bytes as BlobPart], { type: file.mediaType }));
    setUrl(u);
    return () => {
      URL.revokeObjectURL(u);
      setUrl(null);
    };
  }, [bytes, matches, file.mediaType]);
  const state: ImageState =
    q.isError || q.data === null ? 'unavailable' : !bytes ? 'checking' : matches ? 'ok' : 'mismatch';
  const ratio = file.width && file.height ? `${file.width} / ${file.height}` : '4 / 3';
  return (
    <div className="pl-figure-frame" style={{ aspectRatio: ratio }} data-image-state={state}>
      {state === 'ok' && url && (
        <img src={url} alt={alt} width={file.width} height={file.height} decoding="async" />
      )}
      {state === 'checking' && <p className="pl-figure-note">Checking the image…</p>}
      {state === 'mismatch' && (
        <p className="pl-figure-note pl-bad">
          This image does not match the fingerprint recorded on the roll, so it is not shown.
        </p>
      )}
      {state === 'unavailable' && (
        <p className="pl-figure-note">The image file is not available from the server.</p>
      )}
      {state === 'ok' && (
        <span className="pl-figure-badge">
          <span aria-hidden="true">✓</span> image checked
        </span>
      )}
    </div>
  );
}
