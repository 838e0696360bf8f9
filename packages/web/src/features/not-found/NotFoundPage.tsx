import { Link, Text, Title2, makeStyles, tokens } from '@fluentui/react-components';
import { Link as RouterLink } from 'react-router-dom';

const useStyles = makeStyles({ page: { display: 'grid', gap: tokens.spacingVerticalM } });

export function NotFoundPage() {
  const styles = useStyles();
  return (
    <section className={styles.page}>
      <Title2 as="h1">Page not found</Title2>
      <Text>There is nothing at this address.</Text>
      <Link as="span">
        <RouterLink to="/">Back to the start page</RouterLink>
      </Link>
    </section>
  );
}
