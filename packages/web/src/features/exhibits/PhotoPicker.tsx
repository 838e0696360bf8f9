import type { ExhibitKind } from '@beadroll/core';
import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useEffect, useRef } from 'react';
import { EXHIBIT_KIND_LABELS, EXHIBIT_KIND_OPTIONS, uploadExhibit } from './exhibits.api';
import { SelectField } from '../../common/ui/SelectField';
import { HiddenFileInput } from './HiddenFileInput';
import { UploadProgress } from './UploadProgress';

/** What a photo chosen on the form can show: any kind of exhibit but a receipt (always sealed). */
const PHOTO_KINDS = EXHIBIT_KIND_OPTIONS.filter((k) => k !== 'receipt');

const useStyles = makeStyles({
  buttons: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  list: { listStyleType: 'none', margin: 0, padding: 0, display: 'grid', gap: tokens.spacingVerticalM },
  item: {
    display: 'grid',
    gridTemplateColumns: '72px minmax(0, 1fr)',
    gap: tokens.spacingHorizontalM,
    alignItems: 'start',
  },
  thumb: {
    width: '72px',
    height: '72px',
    objectFit: 'cover',
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground3,
  },
  fields: { display: 'grid', gap: tokens.spacingVerticalXS, minWidth: 0 },
  name: { overflowWrap: 'anywhere' },
});

/** A photo chosen on the register form, uploaded once the lot exists. */
export interface PendingPhoto {
  id: string;
  file: File;
  kind: ExhibitKind;
  url: string;
  progress: number;
  status: 'waiting' | 'sending' | 'done' | 'failed';
  error?: string;
}

let next = 0;

/** New pending photos for chosen files. */
export function pendingPhotos(files: FileList | File[]): PendingPhoto[] {
  return Array.from(files).map((file) => ({
    id: `photo-${++next}`,
    file,
    kind: 'whole-lot',
    url: URL.createObjectURL(file),
    progress: 0,
    status: 'waiting',
  }));
}

/**
 * Uploads the photos one after another as exhibits of `code`, reporting each one's progress
 * through `update`. Resolves with the number that failed.
 */
export async function uploadPending(
  code: string,
  photos: PendingPhoto[],
  update: (id: string, patch: Partial<PendingPhoto>) => void,
): Promise<number> {
  let failed = 0;
  for (const p of photos) {
    if (p.status === 'done') continue;
    update(p.id, { status: 'sending', progress: 0, error: undefined });
    try {
      await uploadExhibit(code, p.file, { kind: p.kind, caption: '', sealed: false }, (f) =>
        update(p.id, { progress: f }),
      );
      update(p.id, { status: 'done', progress: 1 });
    } catch (e) {
      failed++;
      update(p.id, { status: 'failed', error: e instanceof Error ? e.message : 'The upload failed.' });
    }
  }
  return failed;
}

/**
 * Photos on the register form: chosen from the device or taken with the phone's camera (the
 * `capture` input opens the back camera on phones). They are sent as soon as the lot exists.
 */
export function PhotoPicker({
  photos,
  onChange,
  disabled,
}: {
  photos: PendingPhoto[];
  onChange: (photos: PendingPhoto[]) => void;
  disabled?: boolean;
}) {
  const styles = useStyles();
  const choose = useRef<HTMLInputElement>(null);
  const camera = useRef<HTMLInputElement>(null);
  const urls = useRef(new Set<string>());
  useEffect(() => {
    for (const p of photos) urls.current.add(p.url);
  }, [photos]);
  useEffect(() => {
    const all = urls.current;
    return () => all.forEach((u) => URL.revokeObjectURL(u));
  }, []);
  const add = (files: FileList | null) => {
    if (files && files.length) onChange([...photos, ...pendingPhotos(files)]);
  };
  return (
    <>
      <div className={styles.buttons}>
        <Button disabled={disabled} onClick={() => choose.current?.click()}>
          Choose photos
        </Button>
        <Button disabled={disabled} onClick={() => camera.current?.click()}>
          Take a photo
        </Button>
        <HiddenFileInput
          inputRef={choose}
          accept="image/jpeg,image/png,image/webp"
          multiple
          label="Choose photos"
          testId="choose-photos"
          onFiles={add}
        />
        <HiddenFileInput
          inputRef={camera}
          accept="image/*"
          capture="environment"
          label="Take a photo"
          onFiles={add}
        />
      </div>
      {photos.length ? (
        <ul className={styles.list} aria-label="Photos to add">
          {photos.map((p) => (
            <li key={p.id} className={styles.item}>
              <img className={styles.thumb} src={p.url} alt={`Chosen photo ${p.file.name}`} />
              <div className={styles.fields}>
                <Text className={styles.name}>{p.file.name}</Text>
                <SelectField
                  label={`What ${p.file.name} shows`}
                  value={p.kind}
                  options={PHOTO_KINDS}
                  labels={EXHIBIT_KIND_LABELS}
                  disabled={disabled || p.status !== 'waiting'}
                  onChange={(kind) => onChange(photos.map((x) => (x.id === p.id ? { ...x, kind } : x)))}
                />
                {p.status === 'waiting' ? (
                  <Button
                    size="small"
                    disabled={disabled}
                    onClick={() => onChange(photos.filter((x) => x.id !== p.id))}
                  >
                    Remove {p.file.name}
                  </Button>
                ) : (
                  <UploadProgress
                    name={p.file.name}
                    status={p.status}
                    progress={p.progress}
                    failure={p.error}
                    done="Added to the roll."
                  />
                )}
              </div>
            </li>
          ))}
        </ul>
      ) : null}
    </>
  );
}
