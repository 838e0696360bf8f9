import { Body, Controller, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
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
import { Action, Read, RollAction, RollWrite } from '../common/route.decorators';

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

  @RollWrite(
    'offers',
    'Offer a lot to a verified dealer (transfer-offered), or invite an e-mail address to take it',
    CreateOfferResponse,
  )
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

  @RollAction(
    'offers/:id/accept',
    'Accept an open offer (transfer-accepted): the lot is yours',
    OfferResponse,
  )
  accept(
    @CurrentAccount() me: Principal,
    @Param('id') id: string,
    @Body() dto: AnswerOfferDto,
  ): Promise<OfferResponse> {
    return this.transfers.answer(me, id, 'accept', dto);
  }

  @RollAction('offers/:id/decline', 'Decline an open offer (transfer-declined)', OfferResponse)
  decline(
    @CurrentAccount() me: Principal,
    @Param('id') id: string,
    @Body() dto: AnswerOfferDto,
  ): Promise<OfferResponse> {
    return this.transfers.answer(me, id, 'decline', dto);
  }

  @RollAction('offers/:id/withdraw', 'Withdraw your open offer (transfer-withdrawn)', OfferResponse)
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

  @RollAction(
    'invitations/:id/offer',
    'Make the offer of an invitation now that the invitee is verified',
    InvitationResponse,
  )
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

  @RollWrite('sales', 'Record a sale to a private buyer (sold), with a sealed price', SaleResponse)
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
