import { ApiPropertyOptional } from '@nestjs/swagger';
import { LIMITS, type Observations } from '@beadroll/core';
import { IsIn, IsOptional } from 'class-validator';
import { OptionalText } from '../../common/validation';

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
  @ApiPropertyOptional({ enum: HOLE, description: 'powder = white or grey powder in the hole' })
  @IsOptional()
  @IsIn(HOLE)
  hole?: Observations['hole'];

  @ApiPropertyOptional({ enum: HOLE_SHAPE })
  @IsOptional()
  @IsIn(HOLE_SHAPE)
  holeShape?: Observations['holeShape'];

  @ApiPropertyOptional({ enum: WINDING })
  @IsOptional()
  @IsIn(WINDING)
  windingMarks?: Observations['windingMarks'];

  @ApiPropertyOptional({ enum: BEAD_SHAPE })
  @IsOptional()
  @IsIn(BEAD_SHAPE)
  beadShape?: Observations['beadShape'];

  @ApiPropertyOptional({ enum: MOULD_SEAM, description: 'a seam where the halves of a mould met' })
  @IsOptional()
  @IsIn(MOULD_SEAM)
  mouldSeam?: Observations['mouldSeam'];

  @ApiPropertyOptional({ enum: SURFACE })
  @IsOptional()
  @IsIn(SURFACE)
  surface?: Observations['surface'];

  @ApiPropertyOptional({ enum: FOIL })
  @IsOptional()
  @IsIn(FOIL)
  foil?: Observations['foil'];

  @ApiPropertyOptional({ enum: UV_A, description: 'response under a UV-A lamp' })
  @IsOptional()
  @IsIn(UV_A)
  uvA?: Observations['uvA'];

  @OptionalText(LIMITS.longText)
  note?: string;
}
