import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import type { Observations, VerifiedEntry } from '@beadroll/core';
import { renderWithProviders } from '../../common/testing/render';
import { DescriptionSections } from '../lots/LotFormSections';
import { EMPTY_DRAFT, type LotDraft } from '../lots/lot-draft';
import { ObservationChecklist } from '../lots/ObservationChecklist';
import { HandlingCautions } from '../public-lot/HandlingCautions';

function Checklist() {
  const [value, setValue] = useState<Observations>({});
  return <ObservationChecklist value={value} onChange={setValue} />;
}

function Description() {
  const [draft, setDraft] = useState<LotDraft>(EMPTY_DRAFT);
  return (
    <DescriptionSections
      draft={draft}
      change={(key, v) => setDraft((d) => ({ ...d, [key]: v }))}
      error={() => undefined}
    />
  );
}

describe('the observation checklist', () => {
  it('shows the UV caution before any UV result is chosen, with the 365 nm advice marked from memory', () => {
    // UV-C burns eyes and skin: "UV Radiation Safety" (University of Arizona); no source was found
    // for preferring 365 nm over 395 nm torches, so the screen says "from memory".
    renderWithProviders(<Checklist />);
    const uv = screen.getByRole('group', { name: 'Under a UV-A torch' });
    const caution = within(uv).getByLabelText('Caution: ultraviolet light');
    expect(caution).toHaveTextContent(/germicidal \(UV-C\) lamp/);
    expect(caution).toHaveTextContent(/365 nm.*from memory, no source checked/);
    expect(within(uv).getByRole('radio', { name: /Green glow/ })).not.toBeChecked();
  }, 30_000);

  it('marks every group of hints "common practice, no source" beside them, and asks about a mould seam', () => {
    renderWithProviders(<Checklist />);
    const groups = screen.getAllByRole('group').filter((g) => g.tagName === 'FIELDSET');
    expect(groups.length).toBe(8);
    for (const g of groups)
      expect(within(g).getByText('Hints: common practice, no source.')).toBeInTheDocument();
    expect(screen.getByRole('group', { name: 'Mould seam' })).toBeInTheDocument();
  }, 30_000);

  it('brings the uranium handling caution on a green glow, and the lead caution for crystal in the note', async () => {
    // Uranium glass: low doses (US NRC NUREG-1717), so "low risk", never "harmless"; a glow is a hint only.
    // Lead crystal roughly 20–30% lead: "Crystal" (tamararubin.com).
    renderWithProviders(<Checklist />);
    const user = userEvent.setup({ delay: null });
    expect(screen.queryByLabelText('Caution: Handling possible uranium glass')).not.toBeInTheDocument();
    await user.click(screen.getByText('Green glow'));
    const uranium = screen.getByLabelText('Caution: Handling possible uranium glass');
    expect(uranium).toHaveTextContent(/low risk/);
    expect(uranium).toHaveTextContent(/licensed practice/);
    expect(within(uranium).getByRole('link', { name: /NUREG-1717/ })).toBeInTheDocument();
    expect(screen.getByText(/manganese glass can glow greenish too/)).toBeInTheDocument();
    await user.type(
      screen.getByRole('textbox', { name: 'Anything else you noticed' }),
      'Strung with lead crystal spacers',
    );
    expect(screen.getByLabelText('Caution: Lead in glass')).toHaveTextContent(/children/);
  }, 30_000);
});

describe('the description form', () => {
  it('shows the count helper’s formula with its sources beside it', async () => {
    // Formula: "How Many Beads in a Strand" (WireJewelry.com) and "How many beads per inch?" (artbeads.com).
    renderWithProviders(<Description />);
    const helper = screen.getByRole('status', { name: 'Count helper' });
    expect(within(helper).getByRole('link', { name: 'WireJewelry.com' })).toHaveAttribute(
      'href',
      expect.stringContaining('wirejewelry.com/jewelry_making_tips_techniques/How-Many-Beads-in-a-Strand'),
    );
    expect(helper).toHaveTextContent(/× 25.4 ÷ bead size/);
  }, 30_000);

  it('brings the handling cautions when uranium or crystal is written in the description', async () => {
    renderWithProviders(<Description />);
    const user = userEvent.setup({ delay: null });
    expect(screen.queryByRole('group', { name: 'Handling cautions' })).not.toBeInTheDocument();
    await user.type(screen.getByRole('textbox', { name: /Title/ }), 'Uranium glass beads');
    expect(screen.getByLabelText('Caution: Handling possible uranium glass')).toBeInTheDocument();
    await user.type(screen.getByRole('textbox', { name: 'Colours' }), 'crystal, amber');
    expect(screen.getByLabelText('Caution: Lead in glass')).toBeInTheDocument();
  }, 30_000);
});

describe('the public page’s handling cautions', () => {
  const entry = (body: Record<string, unknown>) =>
    ({ body: { nonce: '00', ...body } }) as unknown as VerifiedEntry;

  it('shows the uranium caution for a lot whose record mentions uranium glass, with its sources', () => {
    // US NRC NUREG-1717: exposure pathways of uranium glass (gamma, beta to hands, ingestion).
    render(
      <HandlingCautions
        entries={[
          entry({ description: { title: 'Uranium glass pressed beads', colours: [], decoration: [] } }),
        ]}
      />,
    );
    const section = screen.getByRole('region', { name: 'Handling this lot' });
    expect(section).toHaveTextContent(/Possible uranium glass: low risk/);
    expect(within(section).getByRole('link', { name: /NUREG-1717/ })).toBeInTheDocument();
  });

  it('shows nothing for a lot whose record names no such glass', () => {
    const { container } = render(
      <HandlingCautions
        entries={[entry({ description: { title: 'Blue beads', colours: [], decoration: [] } })]}
      />,
    );
    expect(container).toBeEmptyDOMElement();
  });
});
