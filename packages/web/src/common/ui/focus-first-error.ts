const CONTROL = 'input, select, textarea, button';

/**
 * After a refused submit, brings the first field marked invalid inside `root` into view and
 * focuses it (its message sits beside it). Fluent marks a Field's control `aria-invalid`; a
 * group of choices is marked `data-invalid`, and its first control takes the focus.
 */
export function focusFirstError(root: HTMLElement | null): void {
  requestAnimationFrame(() => {
    const el = root?.querySelector<HTMLElement>('[aria-invalid="true"], [data-invalid="true"]');
    if (!el) return;
    const target = el.matches(CONTROL) ? el : (el.querySelector<HTMLElement>(CONTROL) ?? el);
    // Every browser has scrollIntoView; a test DOM without layout (jsdom) does not.
    target.scrollIntoView?.({ block: 'center' });
    target.focus({ preventScroll: true });
  });
}
