import { makeStyles, Text, Title1, Title3, tokens } from '@fluentui/react-components';
import { useSession } from '../accounts/accounts.api';
import { AssessorQueue } from '../opinion-requests/AssessorQueue';
import { FindLotByCode } from '../opinion-requests/FindLotByCode';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '70ch' },
  points: { display: 'grid', gap: tokens.spacingVerticalM, paddingInlineStart: tokens.spacingHorizontalL },
});

/** The start page: an assessor's queue of requests; for everyone else, what Beadroll is for. */
export function HomePage() {
  const styles = useStyles();
  const { account } = useSession();
  if (account?.role === 'assessor')
    return (
      <div className={styles.page}>
        <AssessorQueue />
        <FindLotByCode />
      </div>
    );
  return (
    <section className={styles.page} aria-labelledby="home-title">
      <Title1 as="h1" id="home-title">
        Every lot keeps its story
      </Title1>
      <Text size={400}>
        Dealers in antique and vintage glass beads buy mixed lots, work out where and when the beads were made
        from the hole, the winding, the glass and the wear, and sell them on at fairs, in shops and online.
        The evidence behind an attribution is easily lost when a lot changes hands or is strung into something
        new.
      </Text>
      <Title3 as="h2">What Beadroll keeps</Title3>
      <ul className={styles.points}>
        <li>
          <Text>
            A roll for each lot: who registered it, the clues and photos, every opinion — dissent included.
          </Text>
        </li>
        <li>
          <Text>
            Every transfer between dealers, every split into strands and every combination into a new piece.
          </Text>
        </li>
        <li>
          <Text>A printed tag with a QR code, so a buyer at a fair can check the history on a phone.</Text>
        </li>
      </ul>
      <Text>
        Each entry is linked to the one before by its hash, so a changed or missing entry shows up in the
        buyer’s own browser.
      </Text>
      {account ? <FindLotByCode /> : null}
    </section>
  );
}
