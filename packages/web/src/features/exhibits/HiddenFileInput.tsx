import { makeStyles } from '@fluentui/react-components';
import type { RefObject } from 'react';

const useStyles = makeStyles({
  hidden: { display: 'none' },
});

/**
 * A file input that a button opens (`inputRef.current.click()`). The chosen files go to
 * `onFiles`, and the input is emptied so the same file can be chosen again.
 */
export function HiddenFileInput({
  inputRef,
  accept,
  multiple = false,
  capture,
  label,
  testId,
  onFiles,
}: {
  inputRef: RefObject<HTMLInputElement | null>;
  accept: string;
  multiple?: boolean;
  /** `environment`: a phone opens its back camera instead of its files. */
  capture?: 'environment';
  label?: string;
  testId?: string;
  onFiles: (files: FileList | null) => void;
}) {
  const styles = useStyles();
  return (
    <input
      ref={inputRef}
      className={styles.hidden}
      type="file"
      accept={accept}
      multiple={multiple}
      capture={capture}
      aria-label={label}
      data-testid={testId}
      onChange={(e) => {
        onFiles(e.currentTarget.files);
        e.currentTarget.value = '';
      }}
    />
  );
}
