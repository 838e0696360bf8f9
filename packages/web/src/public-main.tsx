import { FluentProvider, Text, Title2, makeStyles, tokens } from '@fluentui/react-components';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { beadrollTheme } from './app/theme';
import './app/global.css';

const useStyles = makeStyles({
  page: {
    padding: tokens.spacingHorizontalL,
    display: 'grid',
    gap: tokens.spacingVerticalM,
    maxWidth: '720px',
  },
});

function PublicLotPage() {
  const styles = useStyles();
  return (
    <main className={styles.page}>
      <Title2 as="h1">Lot history</Title2>
      <Text>Public lot histories are not available yet.</Text>
    </main>
  );
}

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <FluentProvider theme={beadrollTheme}>
      <PublicLotPage />
    </FluentProvider>
  </StrictMode>,
);
