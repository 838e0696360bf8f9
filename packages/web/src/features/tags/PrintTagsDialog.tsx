import {
  Button,
  Checkbox,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Radio,
  RadioGroup,
  Text,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';
import { ActionDialog } from '../../common/ui/ActionDialog';
import { UnfieldedError } from '../../common/ui/FormPage';
import { SheetPicker, sheetGrid } from './SheetPicker';
import {
  fetchTagPdf,
  listLots,
  tagsQueries,
  type Paper,
  type SheetRequest,
  type TagDesign,
  type TagPrintRequest,
} from './tags.api';

const useStyles = makeStyles({
  form: { display: 'grid', gap: tokens.spacingVerticalM },
  grid: {
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fill, minmax(9rem, 1fr))',
    gap: tokens.spacingHorizontalM,
  },
});

/** A lot offered for printing: its code and whether it has a public page yet. */
export interface PrintableLot {
  code: string;
  listed: boolean;
}

type Media = 'roll' | Paper;

interface SheetForm {
  columns: string;
  rows: string;
  marginTopMm: string;
  marginRightMm: string;
  marginBottomMm: string;
  marginLeftMm: string;
  gapXMm: string;
  gapYMm: string;
}

const SHEET_DEFAULTS: SheetForm = {
  columns: '',
  rows: '',
  marginTopMm: '10',
  marginRightMm: '10',
  marginBottomMm: '10',
  marginLeftMm: '10',
  gapXMm: '3',
  gapYMm: '3',
};

const SHEET_LABELS: Record<keyof SheetForm, string> = {
  columns: 'Columns (blank: as many as fit)',
  rows: 'Rows (blank: as many as fit)',
  marginTopMm: 'Top margin (mm)',
  marginRightMm: 'Right margin (mm)',
  marginBottomMm: 'Bottom margin (mm)',
  marginLeftMm: 'Left margin (mm)',
  gapXMm: 'Gap between columns (mm)',
  gapYMm: 'Gap between rows (mm)',
};

/** Where the next print on a part-used sheet starts, remembered per paper and design. */
const NEXT_FREE = 'beadroll.tags.next-free';

function rememberedFirst(key: string): number {
  try {
    const all = JSON.parse(localStorage.getItem(NEXT_FREE) ?? '{}') as Record<string, number>;
    return Number.isInteger(all[key]) ? all[key]! : 0;
  } catch {
    return 0;
  }
}

function rememberFirst(key: string, next: number): void {
  try {
    const all = JSON.parse(localStorage.getItem(NEXT_FREE) ?? '{}') as Record<string, number>;
    localStorage.setItem(NEXT_FREE, JSON.stringify({ ...all, [key]: next }));
  } catch {
    // A browser that keeps nothing starts each sheet at the first label.
  }
}

function toSheet(paper: Paper, f: SheetForm, outline: boolean, skip: number): SheetRequest {
  const num = (s: string) => Number(s.replace(',', '.'));
  return {
    paper,
    ...(f.columns.trim() ? { columns: num(f.columns) } : {}),
    ...(f.rows.trim() ? { rows: num(f.rows) } : {}),
    marginTopMm: num(f.marginTopMm),
    marginRightMm: num(f.marginRightMm),
    marginBottomMm: num(f.marginBottomMm),
    marginLeftMm: num(f.marginLeftMm),
    gapXMm: num(f.gapXMm),
    gapYMm: num(f.gapYMm),
    skip,
    outline,
  };
}

function download(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/**
 * The print dialog for one lot or a selection: design, label printer or sheet, the sheet's
 * grid. Printing writes nothing on the rolls; listing unlisted lots happens only when the dealer
 * ticks the box.
 */
export function PrintTagsDialog({
  lots,
  triggerLabel = 'Print tag',
  onClose,
}: {
  lots: PrintableLot[];
  triggerLabel?: string;
  /** Opens the dialog at once, with no button of its own; called when it closes. */
  onClose?: () => void;
}) {
  const styles = useStyles();
  const queryClient = useQueryClient();
  const [openState, setOpenState] = useState(false);
  const open = onClose ? true : openState;
  const layouts = useQuery({ ...tagsQueries.layouts(), enabled: open });
  const setOpen = (v: boolean) => (onClose ? !v && onClose() : setOpenState(v));
  const [design, setDesign] = useState<TagDesign>('string');
  const [media, setMedia] = useState<Media>('roll');
  const [sheet, setSheet] = useState<SheetForm>(SHEET_DEFAULTS);
  const [outline, setOutline] = useState(false);
  const [confirmList, setConfirmList] = useState(false);
  const unlisted = lots.filter((l) => !l.listed).map((l) => l.code);
  const sheetKey = `${media}/${design}`;
  const [firstBy, setFirstBy] = useState<Record<string, number>>({});
  const grid =
    media !== 'roll' && layouts.data
      ? sheetGrid(
          layouts.data.papers[media],
          layouts.data.defaults[design],
          toSheet(media, sheet, outline, 0),
        )
      : null;
  const perSheet = grid ? grid.columns * grid.rows : 0;
  const first = Math.min(firstBy[sheetKey] ?? rememberedFirst(sheetKey), Math.max(0, perSheet - 1));

  const print = useMutation({
    mutationFn: async () => {
      if (confirmList && unlisted.length) {
        await listLots(unlisted);
        await queryClient.invalidateQueries({ queryKey: ['lots'] });
      }
      const request: TagPrintRequest = {
        lots: lots.map((l) => l.code),
        design,
        ...(media === 'roll' ? {} : { sheet: toSheet(media, sheet, outline, first) }),
      };
      return fetchTagPdf(request);
    },
    onSuccess: (blob) => {
      // The next print on this kind of sheet starts where this one stopped.
      if (media !== 'roll' && perSheet > 0) rememberFirst(sheetKey, (first + lots.length) % perSheet);
      download(blob, lots.length === 1 ? `tag-${lots[0]!.code}.pdf` : `tags-${lots.length}.pdf`);
      setOpen(false);
    },
  });
  const error = print.error instanceof ApiError ? print.error : undefined;
  const fieldMessage = (f: string) => error?.fieldMessage(f);
  const barbell = layouts.data?.designs.find((d) => d.design === 'barbell');
  const stringFit = layouts.data?.designs.find((d) => d.design === 'string');

  const dialog = (
    <ActionDialog
      title={lots.length === 1 ? 'Print a tag' : `Print ${lots.length} tags`}
      close={() => setOpen(false)}
      onSubmit={() => print.mutate()}
      submitLabel={print.isPending ? 'Preparing…' : 'Download PDF'}
      pending={print.isPending}
      narrow
    >
      {barbell && !barbell.fits && (
        <MessageBar intent="warning">
          <MessageBarBody>
            The public address {layouts.data?.host} is long, so its QR code is version {layouts.data?.version}
            : too small to read on a barbell flag ({barbell.reason}). Use the string tag, or a taller flag.
          </MessageBarBody>
        </MessageBar>
      )}
      {stringFit && !stringFit.fits && (
        <MessageBar intent="error">
          <MessageBarBody>No tag design fits this public address: {stringFit.reason}.</MessageBarBody>
        </MessageBar>
      )}
      <Field label="Design" validationMessage={fieldMessage('design') ?? fieldMessage('labelHeightMm')}>
        <RadioGroup value={design} onChange={(_, d) => setDesign(d.value as TagDesign)}>
          <Radio value="string" label="String tag, about 22 × 35 mm" />
          <Radio value="barbell" label="Barbell flag for jewellery, about 13 mm tall" />
        </RadioGroup>
      </Field>
      <Field label="Print on" validationMessage={fieldMessage('sheet.paper')}>
        <RadioGroup value={media} onChange={(_, d) => setMedia(d.value as Media)}>
          <Radio value="roll" label="Label printer (one label per page)" />
          <Radio value="a4" label="A4 label sheet" />
          <Radio value="letter" label="US Letter label sheet" />
        </RadioGroup>
      </Field>
      {media !== 'roll' && (
        <>
          <div className={styles.grid}>
            {(Object.keys(SHEET_LABELS) as (keyof SheetForm)[]).map((k) => (
              <Field key={k} label={SHEET_LABELS[k]} validationMessage={fieldMessage(`sheet.${k}`)}>
                <Input
                  inputMode="decimal"
                  value={sheet[k]}
                  onChange={(_, d) => setSheet((s) => ({ ...s, [k]: d.value }))}
                />
              </Field>
            ))}
          </div>
          <Field label="First free label" validationMessage={fieldMessage('sheet.skip')}>
            {grid ? (
              <SheetPicker
                columns={grid.columns}
                rows={grid.rows}
                first={first}
                count={lots.length}
                onChange={(i) => setFirstBy((f) => ({ ...f, [sheetKey]: i }))}
              />
            ) : (
              <Text>Check the sheet’s columns, rows, margins and gaps.</Text>
            )}
          </Field>
          <Checkbox
            checked={outline}
            onChange={(_, d) => setOutline(Boolean(d.checked))}
            label="Draw cutting lines (plain paper)"
          />
        </>
      )}
      {unlisted.length > 0 && (
        <Field
          hint="A buyer who scans the tag of an unlisted lot finds no page. Listing writes a 'described' entry on
                  its roll; printing alone writes nothing."
        >
          <Checkbox
            checked={confirmList}
            onChange={(_, d) => setConfirmList(Boolean(d.checked))}
            label={
              unlisted.length === 1
                ? 'List this lot, so its history is public'
                : `List the ${unlisted.length} unlisted lots, so their histories are public`
            }
          />
        </Field>
      )}
      <UnfieldedError error={error} />
      {error?.fields.some((f) => f.field === 'host' || f.field === 'lots') && (
        <MessageBar intent="error">
          <MessageBarBody>
            {[fieldMessage('host'), fieldMessage('lots')].filter(Boolean).join(' ')}
          </MessageBarBody>
        </MessageBar>
      )}
      <Text size={200}>A lost tag is simply printed again; the new tag names the lot’s latest entry.</Text>
    </ActionDialog>
  );

  return onClose ? (
    dialog
  ) : (
    <>
      <Button disabled={lots.length === 0} onClick={() => setOpen(true)}>
        {triggerLabel}
      </Button>
      {/* Mounted only while open: a closed dialog would still set up the focus trap's hidden stops. */}
      {open && dialog}
    </>
  );
}
