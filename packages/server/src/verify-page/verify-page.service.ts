import { readFileSync } from 'node:fs';
import { Inject, Injectable } from '@nestjs/common';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';

/** The offline verifier page as served: its bytes and the policy written into it. */
export interface VerifyPage {
  html: Buffer;
  /** The page's own content security policy (inline script and style by hash, no network). */
  policy: string;
}

/**
 * Serves the one-file offline verifier built in packages/verify (`dist/verify.html`). The page
 * carries its content security policy in a meta element; the same policy goes out as the HTTP
 * header, with framing refused, so the served page can reach nothing either.
 */
@Injectable()
export class VerifyPageService {
  private page: VerifyPage | null = null;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  get(): VerifyPage {
    if (this.page) return this.page;
    let html: Buffer;
    try {
      html = readFileSync(this.config.verifyPage);
    } catch {
      throw new AppError('unavailable', 'The verifier page is not built on this server.');
    }
    const meta = /<meta http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html.toString('utf8'));
    if (!meta) throw new AppError('internal', 'The verifier page has no content security policy.');
    this.page = { html, policy: `${meta[1]}; frame-ancestors 'none'` };
    return this.page;
  }
}
