import { Controller, Get, Param } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { type DealerCard, DealerCardsService } from './dealer-cards.service';

@ApiTags('public')
@Public()
@Controller('public/dealers')
export class DealersController {
  constructor(private readonly cards: DealerCardsService) {}

  @Get(':handle')
  @ApiOperation({ summary: 'The public card of a verified dealer or assessor, as reported by the registry' })
  card(@Param('handle') handle: string): Promise<DealerCard> {
    return this.cards.byHandle(handle);
  }
}
