import { makeStyles, ToggleButton, tokens } from '@fluentui/react-components';

const useStyles = makeStyles({
  group: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
});

/**
 * A row of filter buttons, one pressed (`aria-pressed`), named as a group. Used instead of a tab
 * list for filters: they filter one table rather than switch panels, and they add no hidden
 * focus stops (the tab list's arrow-key helper puts focusable, hidden elements around it).
 */
export function FilterButtons<T extends string>({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: T;
  options: ReadonlyArray<{ value: T; label: string }>;
  onChange: (v: T) => void;
}) {
  const styles = useStyles();
  return (
    <div role="group" aria-label={label} className={styles.group}>
      {options.map((o) => (
        <ToggleButton
          key={o.value}
          checked={o.value === value}
          appearance={o.value === value ? 'primary' : 'secondary'}
          onClick={() => onChange(o.value)}
        >
          {o.label}
        </ToggleButton>
      ))}
    </div>
  );
}
