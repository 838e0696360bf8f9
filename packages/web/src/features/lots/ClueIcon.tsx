import { makeStyles, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  icon: { flexShrink: 0, color: tokens.colorNeutralForeground2 },
  glass: { fill: tokens.colorNeutralBackground3, stroke: 'currentColor', strokeWidth: 1.5 },
  hole: { fill: tokens.colorNeutralBackground1, stroke: 'currentColor', strokeWidth: 1.2 },
  mark: { fill: 'none', stroke: 'currentColor', strokeWidth: 1.2, strokeLinecap: 'round' },
  dot: { fill: 'currentColor' },
  green: { fill: 'none', stroke: tokens.colorPaletteGreenForeground1, strokeWidth: 2.2 },
  glow: {
    fill: 'none',
    stroke: tokens.colorPaletteGreenForeground1,
    strokeWidth: 1.5,
    strokeLinecap: 'round',
  },
  foil: { fill: tokens.colorPaletteMarigoldBorderActive, stroke: 'none' },
});

/** The bead seen end on: a round of glass with its hole. */
function EndOn({ hole = true, children }: { hole?: boolean; children?: ReactNode }) {
  const s = useStyles();
  return (
    <>
      <circle cx="16" cy="16" r="12" className={s.glass} />
      {hole ? <circle cx="16" cy="16" r="4" className={s.hole} /> : null}
      {children}
    </>
  );
}

/** The bead seen from the side, its hole running left to right. */
function Side({ children }: { children?: ReactNode }) {
  const s = useStyles();
  return (
    <>
      <ellipse cx="16" cy="16" rx="12" ry="10" className={s.glass} />
      <line x1="2" y1="16" x2="30" y2="16" className={s.mark} strokeDasharray="2 2" />
      {children}
    </>
  );
}

function drawing(question: string, value: string, s: ReturnType<typeof useStyles>): ReactNode {
  switch (`${question}:${value}`) {
    case 'hole:clean':
      return <EndOn />;
    case 'hole:powder':
      return (
        <EndOn>
          <circle cx="14.5" cy="15" r="0.9" className={s.dot} />
          <circle cx="17.5" cy="16.5" r="0.9" className={s.dot} />
          <circle cx="15.5" cy="18" r="0.9" className={s.dot} />
        </EndOn>
      );
    case 'hole:green-traces':
      return (
        <EndOn>
          <path d="M12.5 14.5 A4 4 0 0 1 18 12.4" className={s.green} />
        </EndOn>
      );
    case 'hole:not-seen':
      return (
        <EndOn hole={false}>
          <path d="M13 13 a3 3 0 1 1 4 3 v2" className={s.mark} />
          <circle cx="17" cy="21" r="0.9" className={s.dot} />
        </EndOn>
      );
    case 'holeShape:irregular':
      return (
        <>
          <circle cx="16" cy="16" r="12" className={s.glass} />
          <ellipse cx="18.5" cy="14" rx="5" ry="3.2" transform="rotate(-25 18.5 14)" className={s.hole} />
        </>
      );
    case 'holeShape:regular':
      return <EndOn />;
    case 'windingMarks:seen':
      return (
        <Side>
          <path
            d="M9 8 q3 8 0 16 M14 6.5 q3 9.5 0 19 M19 6.5 q3 9.5 0 19 M24 8 q3 8 0 16"
            className={s.mark}
          />
        </Side>
      );
    case 'windingMarks:not-seen':
      return <Side />;
    case 'beadShape:irregular':
      return (
        <>
          <ellipse cx="6" cy="16" rx="4.5" ry="5.5" className={s.glass} />
          <ellipse cx="16" cy="16" rx="5.5" ry="4" className={s.glass} />
          <ellipse cx="26" cy="16" rx="4" ry="6" className={s.glass} />
        </>
      );
    case 'beadShape:uniform':
      return (
        <>
          <circle cx="6" cy="16" r="4.5" className={s.glass} />
          <circle cx="16" cy="16" r="4.5" className={s.glass} />
          <circle cx="26" cy="16" r="4.5" className={s.glass} />
        </>
      );
    case 'mouldSeam:seen':
      return (
        <Side>
          <line x1="16" y1="5" x2="16" y2="27" className={s.mark} strokeWidth={1.8} />
        </Side>
      );
    case 'mouldSeam:not-seen':
      return <Side />;
    case 'surface:glossy':
      return (
        <EndOn hole={false}>
          <path d="M9.5 12 a8 8 0 0 1 5 -4.5" className={s.mark} strokeWidth={2.5} />
        </EndOn>
      );
    case 'surface:satin':
      return (
        <EndOn hole={false}>
          <path d="M8 14 h16 M7 18 h18 M9 22 h14 M10 10 h12" className={s.mark} strokeOpacity={0.5} />
        </EndOn>
      );
    case 'surface:matte':
      return (
        <EndOn hole={false}>
          {[
            [11, 11],
            [17, 9],
            [21, 14],
            [12, 17],
            [18, 19],
            [14, 23],
            [22, 21],
            [8, 15],
          ].map(([x, y]) => (
            <circle key={`${x}-${y}`} cx={x} cy={y} r="0.8" className={s.dot} />
          ))}
        </EndOn>
      );
    case 'surface:worn':
      return (
        <EndOn hole={false}>
          <path d="M9 11 l6 4 M15 20 l8 -3 M12 24 l3 -2 M19 9 l3 3" className={s.mark} />
        </EndOn>
      );
    case 'foil:none':
      return <Side />;
    case 'foil:intact':
      return (
        <Side>
          <rect x="11" y="7" width="10" height="18" rx="2" className={s.foil} />
        </Side>
      );
    case 'foil:worn':
      return (
        <Side>
          <path d="M11 8 h10 v5 h-4 v4 h4 v7 h-10 v-6 h3 v-3 h-3 z" className={s.foil} />
        </Side>
      );
    case 'uvA:not-tested':
      return (
        <>
          <rect x="3" y="13" width="14" height="6" rx="1.5" className={s.glass} />
          <path d="M17 12 l4 -2 v12 l-4 -2 z" className={s.glass} />
        </>
      );
    case 'uvA:none':
      return (
        <>
          <rect x="2" y="13" width="10" height="6" rx="1.5" className={s.glass} />
          <path d="M12 12 l3 -2 v12 l-3 -2 z" className={s.glass} />
          <circle cx="25" cy="16" r="5" className={s.glass} />
        </>
      );
    case 'uvA:green-glow':
      return (
        <>
          <rect x="2" y="13" width="10" height="6" rx="1.5" className={s.glass} />
          <path d="M12 12 l3 -2 v12 l-3 -2 z" className={s.glass} />
          <circle cx="25" cy="16" r="4.5" className={s.glass} />
          <path
            d="M25 8.5 v-2 M25 25.5 v-2 M31 16 h-1.5 M19.5 10.5 l-1 -1 M30.5 10.5 l1 -1 M30.5 21.5 l1 1"
            className={s.glow}
          />
        </>
      );
    case 'uvA:other':
      return (
        <>
          <rect x="2" y="13" width="10" height="6" rx="1.5" className={s.glass} />
          <path d="M12 12 l3 -2 v12 l-3 -2 z" className={s.glass} />
          <circle cx="25" cy="16" r="4.5" className={s.glass} />
          <path d="M25 8.5 v-2 M25 25.5 v-2 M31 16 h-1.5" className={s.mark} />
        </>
      );
    default:
      return null;
  }
}

/** A small drawing of one clue, made for Beadroll; decorative (the label says the same). */
export function ClueIcon({ question, value, size = 32 }: { question: string; value: string; size?: number }) {
  const s = useStyles();
  const d = drawing(question, value, s);
  if (!d) return null;
  return (
    <svg
      className={s.icon}
      width={size}
      height={size}
      viewBox="0 0 32 32"
      aria-hidden="true"
      focusable="false"
      data-clue={`${question}:${value}`}
    >
      {d}
    </svg>
  );
}
