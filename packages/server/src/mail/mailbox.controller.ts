import { Controller, Get, Header, Inject, Param, ParseIntPipe, Req } from '@nestjs/common';
import { ApiExcludeController } from '@nestjs/swagger';
import type { Request } from 'express';
import { Public } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { type CapturedMail, FakeSmtpService } from './fake-smtp.service';

const LOOPBACK = new Set(['127.0.0.1', '::1', '::ffff:127.0.0.1']);

function esc(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );
}

function linkify(text: string): string {
  return esc(text).replace(/https?:\/\/[^\s<]+/g, (u) => `<a href="${u}">${u}</a>`);
}

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>body{font-family:system-ui,sans-serif;margin:0;padding:16px;background:#f5f5f5;color:#242424}
h1{font-size:22px}article{background:#fff;border-radius:6px;padding:12px 16px;margin:12px 0}
pre{white-space:pre-wrap;word-break:break-word;font:inherit}.meta{color:#616161;font-size:14px}</style></head>
<body><h1>${esc(title)}</h1>${body}</body></html>`;
}

function article(m: CapturedMail): string {
  return `<article aria-label="${esc(m.subject)}"><h2>${esc(m.subject)}</h2>
<p class="meta">To ${esc(m.to.join(', '))} · ${esc(m.receivedAt)} · <a href="/dev/mailbox/${m.id}">HTML part</a></p>
<pre>${linkify(m.text)}</pre></article>`;
}

/**
 * The development mailbox: what the fake SMTP server received. Exists only when DEV_MAILBOX is on,
 * and answers only requests from this machine.
 */
@ApiExcludeController()
@Public()
@Controller('dev/mailbox')
export class MailboxController {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly fake: FakeSmtpService,
  ) {}

  private allow(req: Request): void {
    const local = LOOPBACK.has(req.socket.remoteAddress ?? '') && LOOPBACK.has(req.ip ?? '');
    if (!this.config.devMailbox || !local) throw new AppError('not_found', 'Not found.');
  }

  @Get()
  @Header('Content-Type', 'text/html; charset=utf-8')
  @Header('Cache-Control', 'no-store')
  async list(@Req() req: Request): Promise<string> {
    this.allow(req);
    const messages = await this.fake.mailbox();
    const body = !messages
      ? '<p>The fake SMTP server is off (FAKE_SMTP=false): mail goes to the configured server.</p>'
      : messages.length
        ? messages.map(article).join('\n')
        : '<p>No mail yet.</p>';
    const whose = this.fake.shared ? 'every Beadroll instance of this cluster' : 'this Beadroll server';
    return page('Development mailbox', `<p class="meta">Mail sent by ${whose}, newest first.</p>${body}`);
  }

  @Get(':id')
  @Header('Content-Type', 'text/html; charset=utf-8')
  @Header('Cache-Control', 'no-store')
  async one(@Req() req: Request, @Param('id', ParseIntPipe) id: number): Promise<string> {
    this.allow(req);
    const m = (await this.fake.mailbox())?.find((x) => x.id === id);
    if (!m) throw new AppError('not_found', 'Not found.');
    return m.html || page(m.subject, `<pre>${linkify(m.text)}</pre>`);
  }
}
