import { Badge, Button, Caption1, Link, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { PanelDialog } from '../../common/ui/ActionDialog';
import { EXHIBIT_KIND_LABELS, type ExhibitResponse } from './exhibits.api';
import { VerifiedImage } from './VerifiedImage';

const useStyles = makeStyles({
  grid: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fill, minmax(10rem, 1fr))',
    gap: tokens.spacingHorizontalM,
    listStyleType: 'none',
    margin: 0,
    padding: 0,
  },
  card: {
    display: 'grid',
    gap: tokens.spacingVerticalXS,
    alignContent: 'start',
    padding: tokens.spacingHorizontalS,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
  },
  open: {
    padding: 0,
    minWidth: 0,
    height: 'auto',
    justifyContent: 'center',
    backgroundColor: tokens.colorNeutralBackground3,
  },
  thumb: { display: 'block', width: '100%', height: '9rem', objectFit: 'contain' },
  hash: { fontFamily: tokens.fontFamilyMonospace },
  big: { display: 'block', maxWidth: '100%', maxHeight: '70vh', margin: '0 auto' },
  meta: { display: 'grid', gap: tokens.spacingVerticalXS, marginBlockStart: tokens.spacingVerticalM },
});

/** The first 12 hex digits of a SHA-256, as shown beside an exhibit. */
export function hashPrefix(sha256: string): string {
  return sha256.slice(0, 12);
}

function shownFile(e: ExhibitResponse, role: 'thumbnail' | 'web') {
  return e.derivatives.find((d) => d.role === role);
}

function title(e: ExhibitResponse): string {
  return e.caption || EXHIBIT_KIND_LABELS[e.kind];
}

/** A lot's exhibits as thumbnails; each opens in a larger view with its caption, kind and hash. */
export function ExhibitGallery({ exhibits }: { exhibits: ExhibitResponse[] }) {
  const styles = useStyles();
  const [open, setOpen] = useState<ExhibitResponse | null>(null);
  if (exhibits.length === 0) return <Text>No exhibits on this roll yet.</Text>;
  const web = open ? shownFile(open, 'web') : undefined;
  return (
    <>
      <ul className={styles.grid} aria-label="Exhibits">
        {exhibits.map((e) => {
          const thumb = shownFile(e, 'thumbnail');
          return (
            <li key={e.seq} className={styles.card} data-testid="exhibit-card">
              <Button
                className={styles.open}
                appearance="subtle"
                aria-label={`Open exhibit ${e.seq}: ${title(e)}`}
                onClick={() => setOpen(e)}
              >
                {thumb && e.urls.thumb ? (
                  <VerifiedImage
                    src={e.urls.thumb}
                    sha256={thumb.sha256}
                    alt={title(e)}
                    className={styles.thumb}
                  />
                ) : (
                  <Text>{e.original.mediaType === 'application/pdf' ? 'PDF document' : 'File'}</Text>
                )}
              </Button>
              <Text weight="semibold">{title(e)}</Text>
              <Caption1>
                {EXHIBIT_KIND_LABELS[e.kind]} · entry {e.seq}
              </Caption1>
              <Caption1 className={styles.hash} title={e.original.sha256}>
                SHA-256 {hashPrefix(e.original.sha256)}…
              </Caption1>
              {e.sealed && (
                <Badge appearance="tint" color="informative">
                  Sealed: only you see it
                </Badge>
              )}
            </li>
          );
        })}
      </ul>
      {/* Mounted only while open: a closed dialog would still set up the focus trap's hidden stops. */}
      {open !== null && (
        <PanelDialog title={title(open)} close={() => setOpen(null)}>
          {web && open.urls.web ? (
            <VerifiedImage src={open.urls.web} sha256={web.sha256} alt={title(open)} className={styles.big} />
          ) : (
            <Text>This exhibit has no picture to show; download the original below.</Text>
          )}
          <div className={styles.meta}>
            {open.caption && <Text>{open.caption}</Text>}
            <Caption1>
              Kind: {EXHIBIT_KIND_LABELS[open.kind]} · entry {open.seq}
            </Caption1>
            <Caption1 className={styles.hash}>SHA-256 of the original: {open.original.sha256}</Caption1>
            {open.urls.original && (
              <Link href={open.urls.original} download>
                Download the original ({open.original.mediaType})
              </Link>
            )}
          </div>
        </PanelDialog>
      )}
    </>
  );
}
