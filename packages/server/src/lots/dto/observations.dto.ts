import { LIMITS, type Observations } from '@beadroll/core';
import { OptionalChoice, OptionalText } from '../../common/validation';

const HOLE = ['clean', 'powder', 'green-traces', 'not-seen'] as const;
const HOLE_SHAPE = ['irregular', 'regular'] as const;
const WINDING = ['seen', 'not-seen'] as const;
const BEAD_SHAPE = ['irregular', 'uniform'] as const;
const MOULD_SEAM = ['seen', 'not-seen'] as const;
const SURFACE = ['glossy', 'satin', 'matte', 'worn'] as const;
const FOIL = ['none', 'intact', 'worn'] as const;
const UV_A = ['not-tested', 'none', 'green-glow', 'other'] as const;

/** The physical clues a dealer records; a field left out was not recorded. */
export class ObservationsDto implements Observations {
  @OptionalChoice(HOLE, { description: 'powder = white or grey powder in the hole' })
  hole?: Observations['hole'];

  @OptionalChoice(HOLE_SHAPE) holeShape?: Observations['holeShape'];

  @OptionalChoice(WINDING) windingMarks?: Observations['windingMarks'];

  @OptionalChoice(BEAD_SHAPE) beadShape?: Observations['beadShape'];

  @OptionalChoice(MOULD_SEAM, { description: 'a seam where the halves of a mould met' })
  mouldSeam?: Observations['mouldSeam'];

  @OptionalChoice(SURFACE) surface?: Observations['surface'];

  @OptionalChoice(FOIL) foil?: Observations['foil'];

  @OptionalChoice(UV_A, { description: 'response under a UV-A lamp' }) uvA?: Observations['uvA'];

  @OptionalText(LIMITS.longText)
  note?: string;
}
