// Pictures for the demo exhibits, drawn as SVG (beads as simple shapes) and rasterised by sharp
// at load time. Every picture says plainly that it is an illustration, not a photograph.

/** What a demo picture shows. */
export interface DemoPicture {
  scene: 'strand' | 'loose' | 'hole' | 'uv-a' | 'page' | 'receipt';
  /** Base glass colours, used in turn. */
  beads: string[];
  decoration: 'none' | 'roses' | 'forget-me-nots' | 'facets' | 'chevron' | 'eyes';
  count?: number;
}

const W = 1200;
const H = 800;

/** A small repeatable sequence, so a picture is the same on every machine. */
function sequence(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function label(dark: boolean): string {
  const fg = dark ? '#f2f2f2' : '#2b2b2b';
  const bg = dark ? '#000000' : '#ffffff';
  return `<g font-family="DejaVu Sans, sans-serif">
  <rect x="24" y="24" rx="10" width="620" height="64" fill="${bg}" fill-opacity="0.72"/>
  <text x="44" y="66" font-size="30" font-weight="bold" fill="${fg}">Illustration</text>
  <text x="256" y="66" font-size="22" fill="${fg}">drawn for the demo, not a photo</text>
</g>`;
}

/** One bead seen from the side, centred on (x, y). */
function bead(
  x: number,
  y: number,
  r: number,
  colour: string,
  decoration: DemoPicture['decoration'],
  i: number,
) {
  const parts = [
    `<ellipse cx="${x}" cy="${y}" rx="${r}" ry="${r * 0.92}" fill="${colour}" stroke="#00000033" stroke-width="2"/>`,
    `<ellipse cx="${x - r * 0.35}" cy="${y - r * 0.4}" rx="${r * 0.28}" ry="${r * 0.16}" fill="#ffffff" fill-opacity="0.55"/>`,
  ];
  const rand = sequence(i * 97 + 13);
  if (decoration === 'roses') {
    for (let k = 0; k < 3; k++) {
      const a = (k / 3) * Math.PI * 2 + rand();
      const cx = x + Math.cos(a) * r * 0.45;
      const cy = y + Math.sin(a) * r * 0.45;
      parts.push(
        `<ellipse cx="${cx + r * 0.16}" cy="${cy + r * 0.05}" rx="${r * 0.13}" ry="${r * 0.06}" fill="#4e8a3c"/>`,
        `<circle cx="${cx}" cy="${cy}" r="${r * 0.14}" fill="#e58aa3"/>`,
        `<circle cx="${cx}" cy="${cy}" r="${r * 0.06}" fill="#b9466a"/>`,
      );
    }
  } else if (decoration === 'forget-me-nots') {
    for (let k = 0; k < 4; k++) {
      const cx = x + (rand() - 0.5) * r;
      const cy = y + (rand() - 0.5) * r;
      for (let p = 0; p < 5; p++) {
        const a = (p / 5) * Math.PI * 2;
        parts.push(
          `<circle cx="${cx + Math.cos(a) * r * 0.08}" cy="${cy + Math.sin(a) * r * 0.08}" r="${r * 0.06}" fill="#6f9be0"/>`,
        );
      }
      parts.push(`<circle cx="${cx}" cy="${cy}" r="${r * 0.035}" fill="#f1d35a"/>`);
    }
  } else if (decoration === 'facets') {
    parts.push(
      `<polygon points="${x - r * 0.5},${y} ${x},${y - r * 0.6} ${x + r * 0.5},${y} ${x},${y + r * 0.6}" fill="#ffffff" fill-opacity="0.18" stroke="#00000022"/>`,
    );
  } else if (decoration === 'eyes') {
    for (const dx of [-0.45, 0.1, 0.55]) {
      parts.push(
        `<circle cx="${x + dx * r}" cy="${y + (dx === 0.1 ? -0.3 : 0.2) * r}" r="${r * 0.22}" fill="#f7f7f2"/>`,
        `<circle cx="${x + dx * r}" cy="${y + (dx === 0.1 ? -0.3 : 0.2) * r}" r="${r * 0.11}" fill="#1a2f6b"/>`,
      );
    }
  } else if (decoration === 'chevron') {
    parts.push(
      `<polyline points="${x - r * 0.8},${y} ${x - r * 0.4},${y - r * 0.35} ${x},${y} ${x + r * 0.4},${y - r * 0.35} ${x + r * 0.8},${y}" fill="none" stroke="#f4f1ea" stroke-width="${r * 0.12}"/>`,
      `<polyline points="${x - r * 0.8},${y + r * 0.3} ${x - r * 0.4},${y - r * 0.05} ${x},${y + r * 0.3} ${x + r * 0.4},${y - r * 0.05} ${x + r * 0.8},${y + r * 0.3}" fill="none" stroke="#b3262a" stroke-width="${r * 0.1}"/>`,
    );
  }
  return parts.join('\n');
}

function strand(p: DemoPicture): string {
  const n = p.count ?? 9;
  const r = Math.min(60, (W - 200) / n / 2);
  const point = (t: number) => ({ x: 100 + t * (W - 200), y: 470 - Math.sin(t * Math.PI) * 160 });
  const beads = Array.from({ length: n }, (_, i) => {
    const { x, y } = point((i + 0.5) / n);
    return bead(x, y, r, p.beads[i % p.beads.length], p.decoration, i);
  });
  return `<rect width="${W}" height="${H}" fill="#ece5d6"/>
<path d="M 40 520 Q ${W / 2} ${470 - 330} ${W - 40} 520" fill="none" stroke="#8a7a5c" stroke-width="4"/>
${beads.join('\n')}`;
}

function loose(p: DemoPicture, glow: boolean): string {
  const n = p.count ?? 12;
  const rand = sequence(n * 31 + p.beads.length);
  const beads: string[] = [];
  const cols = Math.max(2, Math.ceil(n / 3));
  const step = (W - 360) / (cols - 1);
  for (let i = 0; i < n; i++) {
    const x = 180 + (i % cols) * step + (rand() - 0.5) * 50;
    const y = 230 + Math.floor(i / cols) * 190 + (rand() - 0.5) * 40;
    const r = 52 + rand() * 16;
    beads.push(bead(x, y, r, p.beads[i % p.beads.length], p.decoration, i));
    if (i % 3 === 0)
      beads.push(
        `<ellipse cx="${x}" cy="${y}" rx="${r * 0.16}" ry="${r * 0.12}" fill="#000000" fill-opacity="0.55"/>`,
      );
  }
  if (glow)
    return `<defs><filter id="glow" x="-50%" y="-50%" width="200%" height="200%"><feGaussianBlur stdDeviation="14"/></filter></defs>
<rect width="${W}" height="${H}" fill="#150c26"/>
<g filter="url(#glow)" opacity="0.9">${beads.join('\n')}</g>
<g>${beads.join('\n')}</g>`;
  return `<rect width="${W}" height="${H}" fill="#d9d2c3"/>
<rect x="70" y="110" width="${W - 140}" height="${H - 170}" rx="24" fill="#c9bfa9" stroke="#a69a7f" stroke-width="6"/>
${beads.join('\n')}`;
}

function hole(p: DemoPicture): string {
  const cx = W / 2;
  const cy = H / 2 + 30;
  const rings =
    p.decoration === 'chevron'
      ? Array.from({ length: 6 }, (_, k) => {
          const r = 300 - k * 45;
          const pts = Array.from({ length: 24 }, (_, j) => {
            const a = (j / 24) * Math.PI * 2;
            const rr = j % 2 === 0 ? r : r - 28;
            return `${cx + Math.cos(a) * rr},${cy + Math.sin(a) * rr}`;
          }).join(' ');
          return `<polygon points="${pts}" fill="${p.beads[k % p.beads.length]}" stroke="#00000022"/>`;
        }).join('\n')
      : `<circle cx="${cx}" cy="${cy}" r="300" fill="${p.beads[0]}" stroke="#00000033" stroke-width="3"/>
${Array.from({ length: 7 }, (_, k) => `<circle cx="${cx}" cy="${cy}" r="${110 + k * 26}" fill="none" stroke="#8c857a" stroke-opacity="0.35" stroke-width="3"/>`).join('\n')}`;
  return `<rect width="${W}" height="${H}" fill="#e4ddcf"/>
${rings}
<circle cx="${cx}" cy="${cy}" r="78" fill="#9a958c"/>
<circle cx="${cx}" cy="${cy}" r="52" fill="#2d2a27"/>`;
}

function paper(lines: string[], extra = ''): string {
  const text = lines
    .map(
      (l, i) =>
        `<text x="220" y="${200 + i * 58}" font-family="DejaVu Sans, sans-serif" font-size="${i === 0 ? 40 : 28}" fill="#3a352e">${escapeXml(l)}</text>`,
    )
    .join('\n');
  return `<rect width="${W}" height="${H}" fill="#7b7466"/>
<rect x="170" y="110" width="${W - 340}" height="${H - 160}" fill="#fbf8f0" transform="rotate(-1.5 ${W / 2} ${H / 2})"/>
${text}
${extra}`;
}

function page(p: DemoPicture): string {
  const sketches = p.beads
    .map(
      (c, i) =>
        `<circle cx="${300 + i * 150}" cy="560" r="${60 - i * 12}" fill="${c}" stroke="#3a352e" stroke-width="2"/>`,
    )
    .join('\n');
  return paper(
    ['Layer order (our sketch)', 'outer: blue, then white, then red,', 'repeated towards the core'],
    sketches,
  );
}

function receipt(): string {
  return paper([
    'Sale note',
    'House clearance, an invented town',
    '1 strand white beads with roses',
    'Paid in cash. Thank you.',
  ]);
}

/** The SVG text of a demo picture, 1200 × 800, with its illustration label. */
export function drawDemoPicture(p: DemoPicture): string {
  const body =
    p.scene === 'strand'
      ? strand(p)
      : p.scene === 'loose'
        ? loose(p, false)
        : p.scene === 'uv-a'
          ? loose(p, true)
          : p.scene === 'hole'
            ? hole(p)
            : p.scene === 'page'
              ? page(p)
              : receipt();
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">
${body}
${label(p.scene === 'uv-a')}
</svg>`;
}
