/**
 * Whether a stored JSON value equals a value as JSON would write it (a property holding
 * `undefined` counts as absent), without copying either. False for anything it does not
 * recognise, so a caller that then compares the JSON copies in full never misses a difference.
 */
export function sameJson(stored: unknown, value: unknown): boolean {
  if (stored === value) return true;
  if (typeof stored !== 'object' || typeof value !== 'object' || stored === null || value === null)
    return false;
  if (Array.isArray(stored)) {
    if (!Array.isArray(value) || stored.length !== value.length) return false;
    for (let i = 0; i < stored.length; i++) if (!sameJson(stored[i], value[i])) return false;
    return true;
  }
  if (Array.isArray(value) || Object.getPrototypeOf(value) !== Object.prototype) return false;
  const s = stored as Record<string, unknown>;
  const v = value as Record<string, unknown>;
  let keys = 0;
  for (const k of Object.keys(v)) {
    if (v[k] === undefined) continue;
    keys++;
    if (!Object.prototype.hasOwnProperty.call(s, k) || !sameJson(s[k], v[k])) return false;
  }
  return Object.keys(s).length === keys;
}
