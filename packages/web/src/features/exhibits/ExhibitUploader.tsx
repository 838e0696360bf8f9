import {
  Button,
  Caption1,
  Checkbox,
  Field,
  Input,
  makeStyles,
  mergeClasses,
  Text,
  tokens,
} from '@fluentui/react-components';
import { LIMITS, type ExhibitKind } from '@beadroll/core';
import { useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState } from 'react';
import { ApiError } from '../../lib/api';
import { UvACaution } from '../safety/UvACaution';
import { EXHIBIT_KIND_LABELS, EXHIBIT_KIND_OPTIONS, uploadExhibit } from './exhibits.api';
import { SelectField } from '../../common/ui/SelectField';
import { HiddenFileInput } from './HiddenFileInput';
import { UploadProgress } from './UploadProgress';

/** What the file picker offers; the server decides the real type from the bytes. */
export const ACCEPTED_TYPES = 'image/jpeg,image/png,image/webp,image/avif,application/pdf';

type Status = 'ready' | 'sending' | 'done' | 'failed';

interface Pending {
  id: number;
  file: File;
  kind: ExhibitKind;
  caption: string;
  sealed: boolean;
  progress: number;
  status: Status;
  error?: ApiError;
  notes: string[];
}

const useStyles = makeStyles({
  root: { display: 'grid', gap: tokens.spacingVerticalM },
  drop: {
    display: 'grid',
    justifyItems: 'start',
    gap: tokens.spacingVerticalS,
    padding: tokens.spacingHorizontalL,
    border: `${tokens.strokeWidthThick} dashed ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  dropActive: {
    border: `${tokens.strokeWidthThick} dashed ${tokens.colorBrandStroke1}`,
    backgroundColor: tokens.colorBrandBackground2,
  },
  pickers: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  list: { display: 'grid', gap: tokens.spacingVerticalL, listStyleType: 'none', margin: 0, padding: 0 },
  item: {
    display: 'grid',
    gap: tokens.spacingVerticalS,
    padding: tokens.spacingHorizontalM,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusMedium,
  },
  row: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'end' },
  grow: { flexGrow: 1, minWidth: '14rem' },
});

function sizeLabel(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.ceil(bytes / 1024)} kB`;
}

let nextId = 1;

/**
 * Adds evidence files to a lot: drop them, pick them or take a photo; give each a kind and a
 * caption; each file becomes one `exhibit-added` entry, with its own progress bar.
 */
export function ExhibitUploader({ code }: { code: string }) {
  const styles = useStyles();
  const client = useQueryClient();
  const [items, setItems] = useState<Pending[]>([]);
  const [dragging, setDragging] = useState(false);
  const pickRef = useRef<HTMLInputElement>(null);
  const cameraRef = useRef<HTMLInputElement>(null);
  const hintId = useId();

  const update = (id: number, patch: Partial<Pending>) =>
    setItems((xs) => xs.map((x) => (x.id === id ? { ...x, ...patch } : x)));

  const add = (files: FileList | File[] | null) => {
    if (!files) return;
    const added = [...files].map<Pending>((file) => ({
      id: nextId++,
      file,
      kind: 'close-up',
      caption: '',
      sealed: false,
      progress: 0,
      status: 'ready',
      notes: [],
    }));
    setItems((xs) => [...xs, ...added]);
  };

  const send = async () => {
    const ready = items.filter((x) => x.status === 'ready' || x.status === 'failed');
    // One at a time: a phone on a fair's network does better with one upload than with five.
    for (const item of ready) {
      update(item.id, { status: 'sending', progress: 0, error: undefined });
      try {
        const res = await uploadExhibit(
          code,
          item.file,
          { kind: item.kind, caption: item.caption.trim(), sealed: item.sealed },
          (progress) => update(item.id, { progress }),
        );
        update(item.id, { status: 'done', progress: 1, notes: res.notes });
      } catch (e) {
        const error =
          e instanceof ApiError ? e : new ApiError(0, 'network', 'The upload stopped. Please try again.');
        update(item.id, { status: 'failed', error });
      }
    }
    // Everything under ['lots'] (the gallery, and the roll the lot page verifies) reloads.
    await client.invalidateQueries({ queryKey: ['lots'] });
  };

  const sending = items.some((x) => x.status === 'sending');
  const waiting = items.filter((x) => x.status === 'ready' || x.status === 'failed').length;

  return (
    <section className={styles.root} aria-label="Add exhibits">
      <div
        className={mergeClasses(styles.drop, dragging && styles.dropActive)}
        data-testid="exhibit-drop"
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          add(e.dataTransfer.files);
        }}
      >
        <Text weight="semibold">Drop photos or documents here</Text>
        <Caption1 id={hintId}>
          JPEG, PNG, WebP or AVIF photos and PDF documents, up to 20 MB each. Location and camera details are
          removed from photos before they are kept.
        </Caption1>
        <div className={styles.pickers}>
          <Button onClick={() => pickRef.current?.click()} aria-describedby={hintId}>
            Choose files
          </Button>
          <Button onClick={() => cameraRef.current?.click()}>Take a photo</Button>
        </div>
        <HiddenFileInput
          inputRef={pickRef}
          multiple
          accept={ACCEPTED_TYPES}
          testId="exhibit-files"
          onFiles={add}
        />
        <HiddenFileInput inputRef={cameraRef} accept="image/*" capture="environment" onFiles={add} />
      </div>

      {items.length > 0 && (
        <ul className={styles.list}>
          {items.map((item) => (
            <li key={item.id} className={styles.item} aria-label={item.file.name}>
              <Text weight="semibold">
                {item.file.name} · {sizeLabel(item.file.size)}
              </Text>
              <div className={styles.row}>
                <SelectField
                  label="Kind"
                  value={item.kind}
                  options={EXHIBIT_KIND_OPTIONS}
                  labels={EXHIBIT_KIND_LABELS}
                  disabled={item.status === 'sending' || item.status === 'done'}
                  onChange={(kind) => update(item.id, { kind })}
                />
                <Field
                  label="Caption"
                  className={styles.grow}
                  validationMessage={item.error?.fieldMessage('caption')}
                >
                  <Input
                    value={item.caption}
                    maxLength={LIMITS.caption}
                    disabled={item.status === 'sending' || item.status === 'done'}
                    onChange={(_e, d) => update(item.id, { caption: d.value })}
                  />
                </Field>
                <Checkbox
                  label="Private (sealed)"
                  checked={item.sealed || item.kind === 'receipt'}
                  disabled={item.kind === 'receipt' || item.status === 'sending' || item.status === 'done'}
                  onChange={(_e, d) => update(item.id, { sealed: d.checked === true })}
                />
              </div>
              {item.kind === 'uv-a' && <UvACaution />}
              <UploadProgress
                name={item.file.name}
                status={item.status}
                progress={item.progress}
                failure={item.error?.fieldMessage('file') ?? item.error?.message}
                done={['Added to the roll.', ...item.notes].join(' ')}
              />
              {item.status !== 'sending' && item.status !== 'done' && (
                <Button
                  appearance="subtle"
                  onClick={() => setItems((xs) => xs.filter((x) => x.id !== item.id))}
                >
                  Remove {item.file.name}
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {waiting > 0 && (
        <div>
          <Button appearance="primary" disabled={sending} onClick={() => void send()}>
            {waiting === 1 ? 'Add 1 exhibit to the roll' : `Add ${waiting} exhibits to the roll`}
          </Button>
        </div>
      )}
    </section>
  );
}
