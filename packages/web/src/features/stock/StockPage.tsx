import type { Origin } from '@beadroll/core';
import {
  Button,
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Subtitle1,
  Text,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useMemo, type ReactNode } from 'react';
import { Navigate } from 'react-router-dom';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { useSession } from '../accounts/accounts.api';
import { ORIGIN_LABEL } from '../lots/labels';
import { formatMoney } from '../transfers/transfers.api';
import { BarChart, type BarSeries } from './BarChart';
import {
  stockExportUrl,
  stockQueries,
  type CurrencyFigures,
  type SalesPeriod,
  type StockGroup,
} from './stock.api';
import { Page } from '../../common/ui/Page';

const useStyles = makeStyles({
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  currency: { display: 'grid', gap: tokens.spacingVerticalM, padding: tokens.spacingHorizontalL },
  grid: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fit, minmax(min(100%, 22rem), 1fr))',
    gap: tokens.spacingHorizontalL,
  },
  figure: { display: 'grid', gap: tokens.spacingVerticalS, margin: 0, minWidth: 0 },
  big: { fontSize: tokens.fontSizeHero700, lineHeight: tokens.lineHeightHero700 },
});

function originWords(key: string): string {
  return key === 'none' ? 'No attribution yet' : (ORIGIN_LABEL[key as Origin] ?? key);
}

function centuryWords(key: string): string {
  return key === 'none' ? 'No period yet' : `${key}s`;
}

function monthWords(period: string): string {
  const [y, m] = period.split('-').map(Number);
  return new Date(Date.UTC(y!, (m ?? 1) - 1, 1)).toLocaleDateString(undefined, {
    year: 'numeric',
    month: 'short',
    timeZone: 'UTC',
  });
}

/** The dealer's own stock and sales figures, per currency, with charts and the stock export. */
export function StockPage() {
  const styles = useStyles();
  const { account, isLoading } = useSession();
  const query = useQuery({ ...stockQueries.summary(), enabled: account?.role === 'dealer' });
  if (isLoading) return <Spinner label="Loading…" />;
  if (!account) return <Navigate to="/sign-in?next=/stock" replace />;
  if (account.role !== 'dealer') return <Navigate to="/" replace />;
  const data = query.data;

  return (
    <Page
      title="Stock and sales"
      actions={
        <div className={styles.actions}>
          <Button as="a" href={stockExportUrl('csv')} download>
            Download stock as CSV
          </Button>
          <Button as="a" href={stockExportUrl('xlsx')} download>
            Download stock as XLSX
          </Button>
        </div>
      }
    >
      <Text>
        Figures from your own private details only: what you paid (your recorded cost, or the price of a
        transfer you accepted) and what you sold for. Nobody else sees them.
      </Text>
      {query.isPending ? (
        <Spinner label="Adding up your figures…" />
      ) : query.isError || !data ? (
        <Card>
          <Text>Your figures could not be loaded. Please try again.</Text>
          <Button onClick={() => query.refetch()}>Try again</Button>
        </Card>
      ) : (
        <>
          {data.lotsWithoutCost > 0 || data.salesWithoutPrice > 0 ? (
            <MessageBar intent="info">
              <MessageBarBody>
                {data.lotsWithoutCost > 0
                  ? `${data.lotsWithoutCost} of the ${data.lotsHeld} lots you hold have no cost recorded and are left out of the stock figures. `
                  : ''}
                {data.salesWithoutPrice > 0
                  ? `${data.salesWithoutPrice} sales have no price you can read and are left out.`
                  : ''}
              </MessageBarBody>
            </MessageBar>
          ) : null}
          {data.currencies.length === 0 ? (
            <Card>
              <Text>
                No figures yet: record what you paid when you register a lot, and a price when you sell one.
              </Text>
            </Card>
          ) : (
            data.currencies.map((c) => <CurrencySection key={c.currency} figures={c} />)
          )}
        </>
      )}
    </Page>
  );
}

function CurrencySection({ figures: f }: { figures: CurrencyFigures }) {
  const styles = useStyles();
  const money = useMemo(
    () => (amount: number) => formatMoney({ amount, currency: f.currency }),
    [f.currency],
  );
  const charts = useMemo(() => {
    const cost = (groups: StockGroup[]): BarSeries[] => [
      { label: 'Cost', values: groups.map((g) => g.cost), colourVar: '--colorBrandBackground' },
    ];
    return {
      origin: { categories: f.stockByOrigin.map((g) => originWords(g.key)), series: cost(f.stockByOrigin) },
      century: {
        categories: f.stockByCentury.map((g) => centuryWords(g.key)),
        series: cost(f.stockByCentury),
      },
      months: {
        categories: f.salesByMonth.map((m) => monthWords(m.period)),
        series: [
          {
            label: 'Sales',
            values: f.salesByMonth.map((m) => m.revenue),
            colourVar: '--colorBrandBackground2Pressed',
          },
          {
            label: 'Margin',
            values: f.salesByMonth.map((m) => m.margin),
            colourVar: '--colorBrandBackground',
          },
        ],
      },
    };
  }, [f]);
  const titleId = `stock-${f.currency}`;

  return (
    <section aria-labelledby={titleId}>
      <Card className={styles.currency}>
        <Title3 as="h2" id={titleId}>
          In {f.currency}
        </Title3>
        <div>
          <Text block>Cost of the stock you hold</Text>
          <Text className={styles.big} weight="semibold">
            {money(f.stock.cost)}
          </Text>
          <Text block>
            {f.stock.lots} {f.stock.lots === 1 ? 'lot' : 'lots'}
          </Text>
        </div>
        {f.stock.lots ? (
          <div className={styles.grid}>
            <Figure heading="Stock by origin">
              <BarChart title={`Cost of stock by origin, ${f.currency}`} format={money} {...charts.origin} />
              <GroupTable
                label="Stock by origin"
                groups={f.stockByOrigin}
                words={originWords}
                money={money}
              />
            </Figure>
            <Figure heading="Stock by period">
              <BarChart
                title={`Cost of stock by century, ${f.currency}`}
                format={money}
                {...charts.century}
              />
              <GroupTable
                label="Stock by period"
                groups={f.stockByCentury}
                words={centuryWords}
                money={money}
              />
            </Figure>
          </div>
        ) : (
          <Text>No lot you hold has a cost in {f.currency}.</Text>
        )}
        <Figure heading="Sales by month">
          {f.salesByMonth.length ? (
            <>
              <BarChart
                title={`Sales and margin by month, ${f.currency}`}
                format={money}
                {...charts.months}
              />
              <Text size={200}>Light bars: what you sold for; dark bars over them: your margin.</Text>
              <SalesTable label="Sales by month" periods={f.salesByMonth} words={monthWords} money={money} />
            </>
          ) : (
            <Text>No sales in {f.currency} yet.</Text>
          )}
        </Figure>
        {f.salesByYear.length ? (
          <Figure heading="Sales by year">
            <SalesTable label="Sales by year" periods={f.salesByYear} words={(p) => p} money={money} />
          </Figure>
        ) : null}
      </Card>
    </section>
  );
}

/** A chart or a table of figures under its own heading. */
function Figure({ heading, children }: { heading: string; children: ReactNode }) {
  const styles = useStyles();
  return (
    <figure className={styles.figure}>
      <Subtitle1 as="h3">{heading}</Subtitle1>
      {children}
    </figure>
  );
}

type Money = (n: number) => string;

function GroupTable({
  label,
  groups,
  words,
  money,
}: {
  label: string;
  groups: StockGroup[];
  words: (key: string) => string;
  money: Money;
}) {
  const columns: Array<ListColumn<StockGroup>> = [
    { id: 'group', header: 'Group', cell: (g) => words(g.key) },
    { id: 'lots', header: 'Lots', numeric: true, cell: (g) => g.lots },
    { id: 'cost', header: 'Cost', numeric: true, cell: (g) => money(g.cost) },
  ];
  return <DataTable label={label} size="small" columns={columns} rows={groups} rowKey={(g) => g.key} />;
}

function SalesTable({
  label,
  periods,
  words,
  money,
}: {
  label: string;
  periods: SalesPeriod[];
  words: (period: string) => string;
  money: Money;
}) {
  const columns: Array<ListColumn<SalesPeriod>> = [
    { id: 'period', header: 'Period', cell: (p) => words(p.period) },
    { id: 'sales', header: 'Sales', numeric: true, cell: (p) => p.sales },
    { id: 'revenue', header: 'Sold for', numeric: true, cell: (p) => money(p.revenue) },
    { id: 'cost', header: 'Cost', numeric: true, cell: (p) => money(p.cost) },
    {
      id: 'margin',
      header: 'Margin',
      numeric: true,
      cell: (p) => `${money(p.margin)}${p.withoutCost ? ` (${p.withoutCost} without cost)` : ''}`,
    },
  ];
  return <DataTable label={label} size="small" columns={columns} rows={periods} rowKey={(p) => p.period} />;
}
