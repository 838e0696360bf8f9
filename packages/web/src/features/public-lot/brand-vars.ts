import type { CSSProperties } from 'react';
import { beadrollBrand } from '../../app/brand';

/** The brand ramp of the app's theme as CSS custom properties (`--brand-10` … `--brand-160`). */
export const brandVars = Object.fromEntries(
  Object.entries(beadrollBrand).map(([shade, colour]) => [`--brand-${shade}`, colour]),
) as CSSProperties;
