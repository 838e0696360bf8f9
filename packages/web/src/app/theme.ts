import { createLightTheme, type Theme } from '@fluentui/react-components';
import { beadrollBrand, FONT_STACK } from './brand';
import '@fontsource/atkinson-hyperlegible/400.css';
import '@fontsource/atkinson-hyperlegible/700.css';

export { beadrollBrand, FONT_STACK };

export const beadrollTheme: Theme = {
  ...createLightTheme(beadrollBrand),
  fontFamilyBase: FONT_STACK,
};
