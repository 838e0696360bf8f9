import { Body, Controller, Get, Header, HttpCode, Post, Query } from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { CheckpointsService } from './checkpoints.service';
import { ConsistencyQueryDto, CosignatureDto, InclusionQueryDto, LeavesQueryDto } from './dto/log.dto';
import {
  ConsistencyProofResponse,
  CosignatureResponse,
  InclusionProofResponse,
  LeavesResponse,
} from './dto/log-responses.dto';
import { LogService } from './log.service';
import { TextAnswer } from '../common/route.decorators';
import { WitnessesService } from './witnesses.service';

/** The public face of the ledger-wide log: key, checkpoint, proofs, leaves, cosignatures. */
@ApiTags('log')
@Public()
@Controller('log')
export class LogController {
  constructor(
    private readonly checkpoints: CheckpointsService,
    private readonly log: LogService,
    private readonly witnesses: WitnessesService,
  ) {}

  @Get('key')
  @Header('Content-Type', 'text/plain; charset=utf-8')
  @ApiOperation({ summary: 'The log’s verifier key: name+keyid+base64key' })
  @TextAnswer('one line: the verifier key (C2SP signed-note)')
  key(): string {
    return this.checkpoints.verifierKey();
  }

  @Get('witnesses')
  @Header('Content-Type', 'text/plain; charset=utf-8')
  @ApiOperation({ summary: 'Verifier keys of the registered witnesses, one a line' })
  @TextAnswer('one verifier key a line, each ending in a newline; empty when there is no witness')
  async witnessKeys(): Promise<string> {
    return (await this.witnesses.list()).map((w) => `${w.key}\n`).join('');
  }

  @Get('checkpoint')
  @Header('Content-Type', 'text/plain; charset=utf-8')
  @Header('Cache-Control', 'no-cache')
  @ApiOperation({ summary: 'The latest signed checkpoint, with every witness cosignature' })
  @TextAnswer('a signed note: the checkpoint’s lines, a blank line, then the signature lines')
  async checkpoint(): Promise<string> {
    const latest = await this.checkpoints.latest();
    if (!latest) throw new AppError('unavailable', 'The log has not signed its first checkpoint yet.');
    return latest.note;
  }

  @Get('proof/inclusion')
  @ApiOperation({ summary: 'Inclusion proof of leaf index in the tree of size leaves (RFC 9162 §2.1.3)' })
  @ApiOkResponse({ type: InclusionProofResponse })
  inclusion(@Query() q: InclusionQueryDto): Promise<InclusionProofResponse> {
    return this.log.inclusion(Number(q.index), Number(q.size));
  }

  @Get('proof/consistency')
  @ApiOperation({ summary: 'Consistency proof between two tree sizes (RFC 9162 §2.1.4)' })
  @ApiOkResponse({ type: ConsistencyProofResponse })
  consistency(@Query() q: ConsistencyQueryDto): Promise<ConsistencyProofResponse> {
    return this.log.consistency(Number(q.from), Number(q.to));
  }

  @Get('leaves')
  @ApiOperation({ summary: 'Entry hashes of leaves start to end − 1 (at most 1000)' })
  @ApiOkResponse({ type: LeavesResponse })
  leaves(@Query() q: LeavesQueryDto): Promise<LeavesResponse> {
    return this.log.leaves(Number(q.start), Number(q.end));
  }

  @Post('cosignatures')
  @HttpCode(201)
  @ApiOperation({ summary: 'A registered witness sends its cosignature of a checkpoint' })
  @ApiCreatedResponse({ type: CosignatureResponse })
  cosign(@Body() dto: CosignatureDto): Promise<CosignatureResponse> {
    return this.witnesses.cosign(dto.checkpoint, dto.cosignature);
  }
}
