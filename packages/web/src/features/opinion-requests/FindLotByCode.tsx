import { Button, Field, Input, makeStyles, tokens } from '@fluentui/react-components';
import { isLotCode, parseLotCode } from '@beadroll/core';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';

const useStyles = makeStyles({
  form: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS, alignItems: 'end' },
});

/** Opens a lot by the code on its tag (any listed lot, for anyone signed in). */
export function FindLotByCode() {
  const styles = useStyles();
  const navigate = useNavigate();
  const [text, setText] = useState('');
  const [error, setError] = useState<string>();
  return (
    <form
      className={styles.form}
      role="search"
      aria-label="Open a lot by its code"
      onSubmit={(e) => {
        e.preventDefault();
        if (!isLotCode(text.trim())) {
          setError('Not a lot code: it has 9 letters and digits, such as 7K2Q-M9XA-T.');
          return;
        }
        setError(undefined);
        navigate(`/lots/${parseLotCode(text.trim())}`);
      }}
    >
      <Field label="Open a lot by its code" validationMessage={error}>
        <Input value={text} onChange={(_, d) => setText(d.value)} placeholder="7K2Q-M9XA-T" />
      </Field>
      <Button type="submit">Open</Button>
    </form>
  );
}
