// Plain values only (a type import from Fluent is erased), so the public lot page can use the
// brand without loading Fluent.
import type { BrandVariants } from '@fluentui/react-components';

/**
 * Beadroll's own brand ramp: a deep sea-glass teal, darkest (10) to lightest (160).
 * Shade 80 carries white text on primary buttons (contrast checked in theme.test.ts).
 */
export const beadrollBrand: BrandVariants = {
  10: '#041216',
  20: '#071f25',
  30: '#092c35',
  40: '#0c3944',
  50: '#0f4654',
  60: '#125364',
  70: '#146073',
  80: '#176d83',
  90: '#1d8aa5',
  100: '#23a7c7',
  110: '#38bbdc',
  120: '#5ac7e2',
  130: '#7dd3e8',
  140: '#a0deee',
  150: '#c2eaf4',
  160: '#e5f6fa',
};

export const FONT_STACK = "'Atkinson Hyperlegible', 'Segoe UI', system-ui, -apple-system, sans-serif";
