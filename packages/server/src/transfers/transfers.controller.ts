import { Body, Controller, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CurrentAccount, Roles, RollWriter, type Principal } from '../auth/auth.decorators';
import {
  AnswerOfferDto,
  CreateOfferDto,
  DealerSearchQueryDto,
  ListOffersQueryDto,
  ListSalesQueryDto,
  RecordSaleDto,
  VoidSaleDto,
} from './dto/transfer-requests.dto';
import {
  CreateOfferResponse,
  DealerSearchResponse,
  InvitationListResponse,
  InvitationResponse,
  OfferListResponse,
  OfferResponse,
  SaleListResponse,
  SaleResponse,
} from './dto/transfer-responses.dto';
import { SalesService } from './sales.service';
import { TransfersService } from './transfers.service';
import { Action, Read } from '../common/route.decorators';

@ApiTags('transfers')
@Controller('transfers')
@Roles('dealer')
export class TransfersController {
  constructor(
    private readonly transfers: TransfersService,
    private readonly sales: SalesService,
  ) {}

  @Read(
    'dealers',
    'Find verified dealers to offer a lot to, by name, handle or business',
    DealerSearchResponse,
  )
  async searchDealers(
    @CurrentAccount() me: Principal,
    @Query() q: DealerSearchQueryDto,
  ): Promise<DealerSearchResponse> {
    return { items: await this.transfers.searchDealers(me, q.q) };
  }

  @Post('offers')
  @RollWriter()
  @ApiOperation({
    summary: 'Offer a lot to a verified dealer (transfer-offered), or invite an e-mail address to take it',
  })
  @ApiOkResponse({ type: CreateOfferResponse })
  offer(@CurrentAccount() me: Principal, @Body() dto: CreateOfferDto): Promise<CreateOfferResponse> {
    return this.transfers.offer(me, dto);
  }

  @Read(
    'offers',
    'Incoming or outgoing offers of the signed-in dealer, with a status filter',
    OfferListResponse,
  )
  list(@CurrentAccount() me: Principal, @Query() q: ListOffersQueryDto): Promise<OfferListResponse> {
    return this.transfers.list(me, q);
  }

  @Read('offers/:id', 'One offer, for either of its two dealers (with the sealed price)', OfferResponse)
  get(@CurrentAccount() me: Principal, @Param('id') id: string): Promise<OfferResponse> {
    return this.transfers.get(me, id);
  }

  @Post('offers/:id/accept')
  @HttpCode(200)
  @RollWriter()
  @ApiOperation({ summary: 'Accept an open offer (transfer-accepted): the lot is yours' })
  @ApiOkResponse({ type: OfferResponse })
  accept(
    @CurrentAccount() me: Principal,
    @Param('id') id: string,
    @Body() dto: AnswerOfferDto,
  ): Promise<OfferResponse> {
    return this.transfers.answer(me, id, 'accept', dto);
  }

  @Post('offers/:id/decline')
  @HttpCode(200)
  @RollWriter()
  @ApiOperation({ summary: 'Decline an open offer (transfer-declined)' })
  @ApiOkResponse({ type: OfferResponse })
  decline(
    @CurrentAccount() me: Principal,
    @Param('id') id: string,
    @Body() dto: AnswerOfferDto,
  ): Promise<OfferResponse> {
    return this.transfers.answer(me, id, 'decline', dto);
  }

  @Post('offers/:id/withdraw')
  @HttpCode(200)
  @RollWriter()
  @ApiOperation({ summary: 'Withdraw your open offer (transfer-withdrawn)' })
  @ApiOkResponse({ type: OfferResponse })
  withdraw(
    @CurrentAccount() me: Principal,
    @Param('id') id: string,
    @Body() dto: AnswerOfferDto,
  ): Promise<OfferResponse> {
    return this.transfers.answer(me, id, 'withdraw', dto);
  }

  @Read('invitations', 'Offers waiting for an invited dealer to join and be verified', InvitationListResponse)
  async invitations(@CurrentAccount() me: Principal): Promise<InvitationListResponse> {
    return { items: await this.transfers.listInvitations(me) };
  }

  @Post('invitations/:id/offer')
  @HttpCode(200)
  @RollWriter()
  @ApiOperation({ summary: 'Make the offer of an invitation now that the invitee is verified' })
  @ApiOkResponse({ type: InvitationResponse })
  offerInvitation(@CurrentAccount() me: Principal, @Param('id') id: string): Promise<InvitationResponse> {
    return this.transfers.offerInvitation(me, id);
  }

  @Action(
    'invitations/:id/cancel',
    'Cancel an invitation (nothing was written on the roll)',
    InvitationResponse,
  )
  cancelInvitation(@CurrentAccount() me: Principal, @Param('id') id: string): Promise<InvitationResponse> {
    return this.transfers.cancelInvitation(me, id);
  }

  @Post('sales')
  @RollWriter()
  @ApiOperation({ summary: 'Record a sale to a private buyer (sold), with a sealed price' })
  @ApiOkResponse({ type: SaleResponse })
  recordSale(@CurrentAccount() me: Principal, @Body() dto: RecordSaleDto): Promise<SaleResponse> {
    return this.sales.record(me, dto);
  }

  @Post('sales/:code/void')
  @HttpCode(204)
  @RollWriter()
  @ApiOperation({ summary: 'Void the lot’s sale recorded by mistake (sale-voided), within 24 hours of it' })
  voidSale(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: VoidSaleDto,
  ): Promise<void> {
    return this.sales.voidSale(me, code, dto);
  }

  @Read('sales', 'Sales of the signed-in dealer, with filters', SaleListResponse)
  listSales(@CurrentAccount() me: Principal, @Query() q: ListSalesQueryDto): Promise<SaleListResponse> {
    return this.sales.list(me, q);
  }
}
