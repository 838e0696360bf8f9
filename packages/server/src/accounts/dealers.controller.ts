import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { DealerCardsService } from './dealer-cards.service';
import { DealerCard, DealerCardsResponse } from './dto/dealer-card.dto';
import { DealerCardsQueryDto } from './dto/dealer-cards.dto';

@ApiTags('public')
@Public()
@Controller('public/dealers')
export class DealersController {
  constructor(private readonly cards: DealerCardsService) {}

  @Get()
  @ApiOperation({
    summary: 'Public cards for account ids seen on rolls; ids never verified are left out',
  })
  @ApiOkResponse({ type: DealerCardsResponse })
  async cardsByIds(@Query() q: DealerCardsQueryDto): Promise<DealerCardsResponse> {
    return { cards: Object.fromEntries(await this.cards.cardsFor(q.ids)) };
  }

  @Get(':handle')
  @ApiOperation({ summary: 'The public card of a verified dealer or assessor, as reported by the registry' })
  @ApiOkResponse({ type: DealerCard })
  card(@Param('handle') handle: string): Promise<DealerCard> {
    return this.cards.byHandle(handle);
  }
}
