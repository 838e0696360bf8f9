import { useMutation } from '@tanstack/react-query';
import './report-problem.css';
import { useId, useState } from 'react';
import { ApiError } from '../../lib/api';
import { REPORT_CATEGORY_LABEL, REPORT_TEXT_MAX, fileReport, type ReportCategory } from './registry.api';

const CATEGORIES = Object.keys(REPORT_CATEGORY_LABEL) as ReportCategory[];

function problem(error: unknown, field: string): string | undefined {
  return error instanceof ApiError ? error.fieldMessage(field) : undefined;
}

/**
 * "Report a problem" on a public lot page: a link that opens a short form. The report goes to
 * the registrar; the optional address is used only for the answer.
 */
export function ReportProblem({ code }: { code: string }) {
  const id = useId();
  const [open, setOpen] = useState(false);
  const [category, setCategory] = useState<ReportCategory | ''>('');
  const [text, setText] = useState('');
  const [email, setEmail] = useState('');
  const [local, setLocal] = useState<Record<string, string>>({});
  // Fields changed since the last attempt: their old errors no longer apply.
  const [edited, setEdited] = useState<ReadonlySet<string>>(new Set());
  const touch = (field: string) => {
    setEdited((s) => (s.has(field) ? s : new Set(s).add(field)));
    setLocal((l) => {
      if (!(field in l)) return l;
      const rest = { ...l };
      delete rest[field];
      return rest;
    });
  };
  const send = useMutation({
    mutationFn: () =>
      fileReport(code, {
        category,
        text: text.trim(),
        ...(email.trim() ? { email: email.trim() } : {}),
      }),
  });

  if (!open) {
    return (
      <p className="pl-report-link">
        <button type="button" className="pl-linkish" onClick={() => setOpen(true)}>
          Report a problem with this page
        </button>
      </p>
    );
  }
  if (send.isSuccess) {
    return (
      <section className="pl-card pl-report" aria-labelledby={`${id}-h`}>
        <h2 id={`${id}-h`}>Report a problem</h2>
        <p role="status">{send.data.message}</p>
      </section>
    );
  }
  const err = (field: string) => local[field] ?? (edited.has(field) ? undefined : problem(send.error, field));
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const found: Record<string, string> = {};
    if (!category) found.category = 'Choose what the problem is.';
    if (text.trim().length < 3) found.text = 'Say what is wrong, in a few words.';
    if (text.length > REPORT_TEXT_MAX) found.text = `At most ${REPORT_TEXT_MAX} characters, please.`;
    setLocal(found);
    setEdited(new Set());
    if (Object.keys(found).length === 0) send.mutate();
  };
  const other =
    send.error && !(send.error instanceof ApiError && send.error.fields.length) ? send.error : null;
  return (
    <section className="pl-card pl-report" aria-labelledby={`${id}-h`}>
      <h2 id={`${id}-h`}>Report a problem</h2>
      <p>
        Tell the registrar what is wrong with this lot’s page. The holder is told that a report came in, but
        not who sent it.
      </p>
      <form noValidate onSubmit={submit}>
        <fieldset aria-describedby={err('category') ? `${id}-cat-err` : undefined}>
          <legend>What is the problem?</legend>
          {CATEGORIES.map((c) => (
            <label key={c} className="pl-choice">
              <input
                type="radio"
                name={`${id}-category`}
                value={c}
                checked={category === c}
                onChange={() => {
                  setCategory(c);
                  touch('category');
                }}
              />{' '}
              {REPORT_CATEGORY_LABEL[c]}
            </label>
          ))}
          {err('category') && (
            <p className="pl-field-error" id={`${id}-cat-err`}>
              {err('category')}
            </p>
          )}
        </fieldset>
        <label htmlFor={`${id}-text`}>What is wrong</label>
        <textarea
          id={`${id}-text`}
          value={text}
          rows={4}
          maxLength={REPORT_TEXT_MAX + 200}
          aria-invalid={Boolean(err('text'))}
          aria-describedby={`${id}-text-count${err('text') ? ` ${id}-text-err` : ''}`}
          onChange={(e) => {
            setText(e.target.value);
            touch('text');
          }}
        />
        <p className="pl-hint" id={`${id}-text-count`}>
          {text.length} of {REPORT_TEXT_MAX} characters
        </p>
        {err('text') && (
          <p className="pl-field-error" id={`${id}-text-err`}>
            {err('text')}
          </p>
        )}
        <label htmlFor={`${id}-email`}>Your e-mail address, if you would like an answer (optional)</label>
        <input
          id={`${id}-email`}
          type="email"
          value={email}
          autoComplete="email"
          aria-invalid={Boolean(err('email'))}
          aria-describedby={err('email') ? `${id}-email-err` : undefined}
          onChange={(e) => {
            setEmail(e.target.value);
            touch('email');
          }}
        />
        {err('email') && (
          <p className="pl-field-error" id={`${id}-email-err`}>
            {err('email')}
          </p>
        )}
        {other && (
          <p className="pl-field-error" role="alert">
            {other instanceof Error ? other.message : 'The report could not be sent.'}
          </p>
        )}
        <div className="pl-report-actions">
          <button type="submit" disabled={send.isPending}>
            Send the report
          </button>
          <button type="button" className="pl-linkish" onClick={() => setOpen(false)}>
            Cancel
          </button>
        </div>
      </form>
    </section>
  );
}
