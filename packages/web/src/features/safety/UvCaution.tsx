import { Link, MessageBar, MessageBarBody, MessageBarTitle, Text } from '@fluentui/react-components';
import { uvCaution } from '@beadroll/core';

/** The UV-A torch caution from core, with its sources; shown wherever a UV test comes up. */
export function UvCaution() {
  const c = uvCaution();
  return (
    <MessageBar intent="warning" layout="multiline" aria-label="UV-A caution">
      <MessageBarBody>
        <MessageBarTitle>UV-A lamps</MessageBarTitle>
        <Text block>{c.text}</Text>
        <Text block size={200}>
          Sources:{' '}
          {c.sources.map((s, i) => (
            <span key={s.title}>
              {i > 0 ? '; ' : ''}
              {s.url ? (
                <Link href={s.url} target="_blank" rel="noreferrer">
                  {s.title}
                </Link>
              ) : (
                s.title
              )}
            </span>
          ))}
        </Text>
      </MessageBarBody>
    </MessageBar>
  );
}
