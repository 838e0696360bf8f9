import { makeStyles, Spinner, Text, Title3, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { ExhibitGallery } from './ExhibitGallery';
import { ExhibitUploader } from './ExhibitUploader';
import { exhibitsQuery } from './exhibits.api';

const useStyles = makeStyles({ root: { display: 'grid', gap: tokens.spacingVerticalM } });

/** The evidence part of a lot page: the gallery, and the uploader for those who may add. */
export function ExhibitsSection({ code, canAdd }: { code: string; canAdd: boolean }) {
  const styles = useStyles();
  const q = useQuery(exhibitsQuery(code));
  return (
    <section className={styles.root} aria-labelledby="exhibits-title">
      <Title3 as="h2" id="exhibits-title">
        Exhibits
      </Title3>
      {q.isPending ? (
        <Spinner size="small" label="Loading exhibits" />
      ) : q.isError ? (
        <Text role="alert">{q.error.message}</Text>
      ) : (
        <ExhibitGallery exhibits={q.data.exhibits} />
      )}
      {canAdd && <ExhibitUploader code={code} />}
    </section>
  );
}
