import {
  Link,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  makeStyles,
  tokens,
} from '@fluentui/react-components';

/**
 * Where each point of the caution comes from. The 365 nm preference is the trade's habit
 * (from memory: 395 nm torches leak violet light that hides a weak glow); the rest is published.
 */
export const UV_A_SOURCES = [
  {
    title: 'UV Radiation Safety — University of Arizona, Research Laboratory & Safety Services',
    href: 'https://research.arizona.edu/compliance/RLSS/radiation-safety/uv-radiation-safety',
  },
  {
    title: 'Beware UVC Lamps as COVID-19 Disinfectant — Prevent Blindness (citing the U.S. FDA)',
    href: 'https://lowvision.preventblindness.org/beware-uvc-lamps-as-covid-19-disinfectant/',
  },
  {
    title: 'Ultraviolet Light Fact Sheet — UMass Amherst Environmental Health & Safety',
    href: 'https://ehs.umass.edu/ultraviolet-light-fact-sheet',
  },
] as const;

const useStyles = makeStyles({
  list: { margin: 0, paddingInlineStart: tokens.spacingHorizontalXL },
  sources: { marginBlockStart: tokens.spacingVerticalXS, fontSize: tokens.fontSizeBase200 },
});

/** The one caution shown wherever a dealer works with an ultraviolet lamp. */
export function UvACaution() {
  const styles = useStyles();
  return (
    <MessageBar intent="warning" layout="multiline" aria-label="Caution: ultraviolet light">
      <MessageBarBody>
        <MessageBarTitle>Working with ultraviolet light</MessageBarTitle>
        <ul className={styles.list}>
          <li>Use a long-wave UV-A torch, near 365 nm, made for checking glass.</li>
          <li>Never use a germicidal (UV-C) lamp: even a short look at one can burn the eyes and skin.</li>
          <li>Never point the torch into anyone’s eyes, your own included; keep skin exposure short.</li>
          <li>Wear eyewear rated for UV; ordinary safety glasses may only be rated for impact.</li>
          <li>Follow your local safety rules and the maker’s instructions; they come first.</li>
        </ul>
        <details className={styles.sources}>
          <summary>Sources</summary>
          <ul className={styles.list}>
            {UV_A_SOURCES.map((s) => (
              <li key={s.href}>
                <Link href={s.href} target="_blank" rel="noreferrer">
                  {s.title}
                </Link>
              </li>
            ))}
          </ul>
        </details>
      </MessageBarBody>
    </MessageBar>
  );
}
