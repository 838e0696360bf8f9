import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Inject, Injectable } from '@nestjs/common';
import { formatLotCode, parseLotCode, tagReference } from '@beadroll/core';
import { DataSource } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError, type FieldProblem } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerClock } from '../ledger/ledger.clock';
import { LotsService } from '../lots/lots.service';
import type { PrintTagsDto } from './dto/print-tags.dto';
import { DESIGN_DEFAULTS, PAPERS, tagFit } from './tag-layout';
import type { TagLayoutsResponse } from './dto/tag-layouts.dto';
import { TagPdfService, type TagItem } from './tag-pdf.service';
import { LotViewsService } from '../lots/lot-views.service';
import { RollReaderService } from '../ledger/roll-reader.service';

/** A lot as the tag maker sees it: what goes on the tag, read from the roll's head. */
export class TagLotResponse {
  @ApiProperty() code: string;
  /** True when the signed-in dealer holds the lot; every other field is then present. */
  @ApiProperty() held: boolean;
  @ApiPropertyOptional() title?: string;
  @ApiPropertyOptional() listed?: boolean;
  @ApiPropertyOptional() status?: string;
  @ApiPropertyOptional() seq?: number;
  @ApiPropertyOptional() ref?: string;
}

/** The codes of the lots the dealer may tag, of those asked for. */
export class TagListResponse {
  @ApiProperty({ type: [String] }) listed: string[];
}

interface HeadRow {
  code: string;
  title: string;
  listed: boolean;
  status: string;
  holder: string;
  head_seq: number;
  hash: string;
}

/**
 * Tags for lots the dealer holds, printed at each lot's head (its newest entry). Printing
 * writes nothing; listing an unlisted lot goes through the lots feature's append path.
 */
@Injectable()
export class TagsService {
  constructor(
    private readonly reader: RollReaderService,
    private readonly views: LotViewsService,
    private readonly dataSource: DataSource,
    private readonly lots: LotsService,
    private readonly pdf: TagPdfService,
    private readonly clock: LedgerClock,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  /** The public host the tags carry (from PUBLIC_BASE_URL). */
  get host(): string {
    return new URL(this.config.publicBaseUrl).host;
  }

  /** `http` only when the public site is served over plain HTTP (a local demo). */
  get scheme(): 'https' | 'http' {
    return new URL(this.config.publicBaseUrl).protocol === 'http:' ? 'http' : 'https';
  }

  layouts(): TagLayoutsResponse {
    const fit = tagFit(this.host);
    return { ...fit, defaults: DESIGN_DEFAULTS, papers: PAPERS };
  }

  /** One lot for the scanner: held or not (the same answer for a lot that does not exist). */
  async lot(me: Principal, text: string): Promise<TagLotResponse> {
    const [code] = this.codes([text], 'code');
    const row = (await this.heads([code!])).get(code!);
    if (!row || row.holder !== me.id) return { code: code!, held: false };
    return {
      code: row.code,
      held: true,
      title: row.title,
      listed: row.listed,
      status: row.status,
      seq: row.head_seq,
      ref: tagReference(row.hash),
    };
  }

  /** The PDF for the selection, or a 400 naming the lots the dealer does not hold. */
  async render(me: Principal, dto: PrintTagsDto): Promise<{ pdf: Buffer; filename: string }> {
    const codes = this.codes(dto.lots, 'lots');
    const rows = await this.heldOnly(me, codes);
    const printedOn = this.clock.now().toISOString().slice(0, 10);
    const items: TagItem[] = codes.map((c) => {
      const r = rows.get(c)!;
      return { code: r.code, title: r.title, seq: r.head_seq, ref: tagReference(r.hash), printedOn };
    });
    const pdf = await this.pdf.render(
      items,
      {
        design: dto.design,
        labelWidthMm: dto.labelWidthMm,
        labelHeightMm: dto.labelHeightMm,
        sheet: dto.sheet && { ...dto.sheet },
      },
      this.host,
      this.scheme,
    );
    const filename = codes.length === 1 ? `tag-${codes[0]}.pdf` : `tags-${printedOn}-${codes.length}.pdf`;
    return { pdf, filename };
  }

  /** Lists the unlisted lots of the selection (the holder's confirmation); returns those it listed. */
  async list(me: Principal, texts: string[]): Promise<{ listed: string[] }> {
    const codes = this.codes(texts, 'lots');
    const rows = await this.heldOnly(me, codes);
    const listed: string[] = [];
    for (const code of codes) {
      if (rows.get(code)!.listed) continue;
      await this.lots.setListing(me, code, true);
      listed.push(code);
    }
    return { listed };
  }

  /** Canonical, de-duplicated codes in the order given; a 400 for each malformed one. */
  private codes(texts: string[], field: string): string[] {
    const problems: FieldProblem[] = [];
    const out: string[] = [];
    texts.forEach((t, i) => {
      try {
        const c = parseLotCode(t);
        if (!out.includes(c)) out.push(c);
      } catch (e) {
        problems.push({
          field: texts.length === 1 && field === 'code' ? field : `${field}.${i}`,
          reason: (e as Error).message,
        });
      }
    });
    if (problems.length) throw AppError.validation(problems);
    return out;
  }

  private async heldOnly(me: Principal, codes: string[]): Promise<Map<string, HeadRow>> {
    const rows = await this.heads(codes);
    // Lots that do not exist and lots held by others get the same answer.
    const missing = codes.filter((c) => rows.get(c)?.holder !== me.id);
    if (missing.length)
      throw AppError.validation([
        {
          field: 'lots',
          reason: `${missing.length === 1 ? 'this is not a lot' : 'these are not lots'} you hold: ${missing.map(formatLotCode).join(', ')}`,
        },
      ]);
    return rows;
  }

  /** Each lot's title, listing and holder from the derived view, with its head from the roll. */
  private async heads(codes: string[]): Promise<Map<string, HeadRow>> {
    const [views, heads] = await Promise.all([this.views.findMany({ codes }), this.reader.findLots(codes)]);
    const out = new Map<string, HeadRow>();
    for (const v of views) {
      const head = heads.find((h) => h.code === v.code);
      if (!head) continue;
      out.set(v.code, {
        code: v.code,
        title: v.title,
        listed: v.listed,
        status: v.status,
        holder: v.holder,
        head_seq: head.headSeq,
        hash: head.headHash.trim(),
      });
    }
    return out;
  }
}
