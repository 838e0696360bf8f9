import { Field, ProgressBar } from '@fluentui/react-components';

/**
 * One file's upload under "Upload of NAME": its progress bar, then, once it ends, `failure` in
 * red or `done` in green.
 */
export function UploadProgress({
  name,
  status,
  progress,
  failure,
  done,
}: {
  name: string;
  status: string;
  progress: number;
  failure?: string;
  done: string;
}) {
  const outcome = status === 'failed' ? 'error' : status === 'done' ? 'success' : undefined;
  return (
    <Field
      label={`Upload of ${name}`}
      validationState={outcome ?? 'none'}
      validationMessage={outcome === 'error' ? failure : outcome === 'success' ? done : undefined}
    >
      <ProgressBar value={progress} max={1} thickness="large" color={outcome ?? 'brand'} />
    </Field>
  );
}
