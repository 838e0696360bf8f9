/** A date in the reader's own words, or a dash when there is none. */
export function formatDate(iso: string | null): string {
  return iso ? new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' }) : '—';
}
