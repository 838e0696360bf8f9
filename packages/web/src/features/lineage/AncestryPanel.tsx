import { Body1, Caption1, Spinner, Subtitle2, makeStyles, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { AncestryDiagram } from './AncestryDiagram';
import { graphFromAncestry, inheritedEvidence } from './graph';
import { ancestryQuery, lotBundleQuery } from './lineage.api';
import { opinionText } from './words';

const useStyles = makeStyles({
  panel: { display: 'grid', gap: tokens.spacingVerticalS },
  list: { margin: 0, paddingLeft: tokens.spacingHorizontalL, display: 'grid', gap: tokens.spacingVerticalXS },
});

/** Where a lot's page is in the dealer app. */
export const lotPageHref = (code: string) => `/lots/${code}`;

/**
 * The ancestry section of a dealer's lot page: the diagram of ancestors and descendants, and
 * the opinions and exhibits inherited from parent lots, apart from the lot's own.
 */
export function AncestryPanel({
  code,
  href = lotPageHref,
}: {
  code: string;
  href?: (code: string) => string;
}) {
  const styles = useStyles();
  const ancestry = useQuery(ancestryQuery(code));
  const bundle = useQuery(lotBundleQuery(code));
  if (ancestry.isLoading) return <Spinner size="tiny" label="Loading the ancestry…" />;
  if (ancestry.isError || !ancestry.data) return <Body1>The ancestry could not be loaded.</Body1>;
  const graph = graphFromAncestry(ancestry.data, href);
  const inherited = bundle.data ? inheritedEvidence(bundle.data, code) : [];
  const alone = graph.nodes.length === 1;
  return (
    <section className={styles.panel} aria-labelledby="lineage-heading">
      <Subtitle2 as="h2" id="lineage-heading">
        Ancestry
      </Subtitle2>
      {alone ? (
        <Body1>This lot was not split from or combined with any other lot.</Body1>
      ) : (
        <AncestryDiagram graph={graph} />
      )}
      {ancestry.data.truncated && <Caption1>Only the nearest lots are shown.</Caption1>}
      {inherited.length > 0 && (
        <>
          <Subtitle2 as="h3">Carried from the lots these beads came from</Subtitle2>
          <Caption1>
            Recorded on earlier lots, not this lot’s own; they count towards this lot’s attribution on record.
          </Caption1>
          <ul className={styles.list} aria-label="Inherited evidence">
            {inherited.map((i) => (
              <li key={`${i.lot}-${i.seq}`}>
                <Body1>
                  {i.kind === 'opinion' && i.opinion
                    ? `Opinion: ${opinionText(i.opinion)}`
                    : `Exhibit: ${i.exhibit?.caption ?? i.exhibit?.kind ?? 'a file'}`}
                </Body1>{' '}
                <Caption1>
                  recorded on lot <a href={href(i.lot)}>{i.displayCode}</a>,{' '}
                  {new Date(i.time).toLocaleDateString()}, {i.before ? 'before' : 'after'} it was{' '}
                  {i.left.kind === 'split' ? 'split' : 'combined'} on{' '}
                  {new Date(i.left.time).toLocaleDateString()}
                </Caption1>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
