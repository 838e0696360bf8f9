import { bodyIssues, LIMITS } from '@beadroll/core';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { draftToRequest, EMPTY_DRAFT } from './lot-draft';
import { DescriptionSections } from './LotFormSections';

const draft = (title: string) => ({ ...EMPTY_DRAFT, title, countValue: '12', colours: 'blue' });

describe('the register form keeps core’s limits', () => {
  it('takes the longest title the roll takes, and refuses one character more, as core does', () => {
    const longest = 'a'.repeat(LIMITS.title);
    const { input, errors } = draftToRequest(draft(longest));
    expect(errors).toEqual({});
    expect(bodyIssues('registered', { description: input!.description, nonce: '0'.repeat(32) })).toEqual([]);

    const tooLong = longest + 'a';
    expect(draftToRequest(draft(tooLong)).errors['description.title']).toBe(
      `Keep the title to ${LIMITS.title} characters.`,
    );
    const issues = bodyIssues('registered', {
      description: { ...input!.description, title: tooLong },
      nonce: '0'.repeat(32),
    });
    expect(issues.map((i) => i.path)).toEqual(['description.title']);
  });

  it('stops typing in the title field at core’s limit', () => {
    render(<DescriptionSections draft={EMPTY_DRAFT} change={() => {}} error={() => undefined} />);
    expect(screen.getByRole('textbox', { name: /Title/ })).toHaveAttribute('maxLength', String(LIMITS.title));
  });
});
