import { makeStyles, Text, tokens } from '@fluentui/react-components';

const useStyles = makeStyles({
  mark: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    paddingBlock: tokens.spacingVerticalXS,
    paddingInline: tokens.spacingHorizontalS,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorPaletteMarigoldBackground1,
    color: tokens.colorNeutralForeground1,
    border: `${tokens.strokeWidthThin} dashed ${tokens.colorPaletteMarigoldBorder2}`,
  },
});

/** A closed padlock, drawn for Beadroll. */
function LockIcon() {
  return (
    <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false">
      <path d="M5 7V5a3 3 0 0 1 6 0v2" fill="none" stroke="currentColor" strokeWidth="1.5" />
      <rect x="3" y="7" width="10" height="7" rx="1.5" fill="currentColor" />
    </svg>
  );
}

/** Says that what follows is sealed: only the dealer who records it can ever read it. */
export function PrivateMark({ text }: { text?: string }) {
  const styles = useStyles();
  return (
    <Text size={200} className={styles.mark}>
      <LockIcon />
      {text ??
        'Private: seen only by you, the dealer who records it. Later holders and buyers never see it; the roll keeps only a sealed digest.'}
    </Text>
  );
}
