import { MessageBar, MessageBarBody, MessageBarTitle, Text } from '@fluentui/react-components';
import type { AidResult } from '@beadroll/core';
import { Stack } from '../../common/ui/Stack';
import { Sources } from './Sources';

/** A short title for each caution core may give. */
export const CAUTION_TITLES: Record<string, string> = {
  'uranium-handling': 'Handling possible uranium glass',
  'lead-glass': 'Lead in glass',
  'foil-cleaning': 'Cleaning foiled beads',
  'acid-history': 'Acid is history, not a method',
  'uv-a-torch': 'Working with ultraviolet light',
};

/**
 * Safety cautions from core, each with its sources beside it. The words and the rules that
 * bring them live in core; this only shows them.
 */
export function SafetyCautions({
  cautions,
  label = 'Cautions',
}: {
  cautions: AidResult['cautions'];
  label?: string;
}) {
  if (cautions.length === 0) return null;
  return (
    <Stack gap="S" role="group" aria-label={label}>
      {cautions.map((c) => (
        <MessageBar
          key={c.rule}
          intent="warning"
          layout="multiline"
          aria-label={`Caution: ${CAUTION_TITLES[c.rule] ?? c.rule}`}
        >
          <MessageBarBody>
            <MessageBarTitle>{CAUTION_TITLES[c.rule] ?? 'Caution'}</MessageBarTitle>
            <Text block>{c.text}</Text>
            <Sources sources={c.sources} />
          </MessageBarBody>
        </MessageBar>
      ))}
    </Stack>
  );
}
