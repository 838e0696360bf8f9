import { beadrollBrand } from '../src/app/brand';

/**
 * The app's icon, drawn here from the brand ramp: three glass beads on a cord, on a teal
 * ground. `maskable` keeps the beads inside the central safe circle (80 % of the width) and fills
 * the whole square, so a launcher may cut any shape from it.
 */
export function iconSvg(maskable: boolean): string {
  const ground = beadrollBrand[80];
  const cord = beadrollBrand[150];
  const beads = [beadrollBrand[140], beadrollBrand[160], beadrollBrand[120]];
  const scale = maskable ? 0.72 : 1;
  const offset = (512 - 512 * scale) / 2;
  const bead = (cx: number, fill: string) =>
    `<g transform="translate(${cx} 256)">` +
    `<ellipse rx="62" ry="78" fill="${fill}"/>` +
    `<ellipse rx="18" ry="22" fill="${ground}"/>` +
    `<ellipse cx="-24" cy="-34" rx="14" ry="20" fill="#ffffff" opacity="0.55"/>` +
    `</g>`;
  const frame = maskable
    ? `<rect width="512" height="512" fill="${ground}"/>`
    : `<rect x="16" y="16" width="480" height="480" rx="112" fill="${ground}"/>`;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512">` +
    frame +
    `<g transform="translate(${offset} ${offset}) scale(${scale})">` +
    `<path d="M40 256 H472" stroke="${cord}" stroke-width="14" stroke-linecap="round"/>` +
    bead(120, beads[0]!) +
    bead(256, beads[1]!) +
    bead(392, beads[2]!) +
    `</g></svg>`
  );
}
