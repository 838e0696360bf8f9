import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { ExhibitKind } from '@beadroll/core';
import sharp from 'sharp';
import { AccountsService } from '../accounts/accounts.service';
import type { Principal } from '../auth/auth.decorators';
import { ExhibitsService } from '../exhibits/exhibits.service';
import { drawDemoPicture, type DemoPicture } from './demo-pictures';
import type { SeedStep } from './seed';
import { LotViewsService } from '../lots/lot-views.service';

/** The scenario's exhibits (the seed-demo folder, as the loader's SEED_DIR). */
const DEMO_EXHIBITS_FILE = resolve(__dirname, '..', '..', '..', '..', 'seed-demo', 'exhibits.json');

/** The exhibits of one demo lot (seed-demo/exhibits.json), named by the lot's title. */
interface DemoLotExhibits {
  lot: string;
  exhibits: Array<{ kind: ExhibitKind; caption: string; sealed?: boolean; picture: DemoPicture }>;
}

/**
 * Seed step: gives several demo lots exhibits, drawn at load time and sent through the same
 * service as an upload (so they are checked, normalised, stored and put on the roll the same
 * way), added by the lot's holder. A lot that already has exhibits, or is not loaded, is skipped.
 */
export const seedExhibits: SeedStep = async (app, ctx) => {
  const accounts = app.get(AccountsService);
  const exhibits = app.get(ExhibitsService);
  const views = app.get(LotViewsService);
  const work = join(ctx.config.dataDir, 'tmp', `demo-exhibits-${randomBytes(8).toString('hex')}`);
  await mkdir(work, { recursive: true, mode: 0o700 });
  try {
    const lots = JSON.parse(readFileSync(DEMO_EXHIBITS_FILE, 'utf8')) as DemoLotExhibits[];
    for (const lot of lots) {
      const found = await views.firstTitled(lot.lot);
      if (!found) continue;
      if (await exhibits.hasAny(found.code)) continue;
      const a = await accounts.find(found.holder);
      if (!a) throw new Error(`demo lot ${found.code} is held by ${found.holder}, who has no account`);
      const holder: Principal = {
        id: a.id,
        role: a.role,
        status: a.status,
        handle: a.handle,
        displayName: a.displayName,
      };
      for (const [i, x] of lot.exhibits.entries()) {
        const path = join(work, `${found.code}-${i}.jpg`);
        await sharp(Buffer.from(drawDemoPicture(x.picture)))
          .flatten({ background: '#ffffff' })
          .jpeg({ quality: 88 })
          .toFile(path);
        await exhibits.add(
          holder,
          found.code,
          { kind: x.kind, caption: x.caption, sealed: x.sealed ? 'true' : 'false' },
          { path },
        );
        await rm(path, { force: true });
      }
    }
  } finally {
    await rm(work, { recursive: true, force: true });
  }
};
