import { Controller, Param, Query } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { DealerCardsService } from './dealer-cards.service';
import { DealerCard, DealerCardsResponse } from './dto/dealer-card.dto';
import { DealerCardsQueryDto } from './dto/dealer-cards.dto';
import { Read } from '../common/route.decorators';

@ApiTags('public')
@Public()
@Controller('public/dealers')
export class DealersController {
  constructor(private readonly cards: DealerCardsService) {}

  @Read(
    undefined,
    'Public cards for account ids seen on rolls; ids never verified are left out',
    DealerCardsResponse,
  )
  async cardsByIds(@Query() q: DealerCardsQueryDto): Promise<DealerCardsResponse> {
    return { cards: Object.fromEntries(await this.cards.cardsFor(q.ids)) };
  }

  @Read(
    ':handle',
    'The public card of a verified dealer or assessor, as reported by the registry',
    DealerCard,
  )
  card(@Param('handle') handle: string): Promise<DealerCard> {
    return this.cards.byHandle(handle);
  }
}
