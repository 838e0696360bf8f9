import type { Request, Response } from 'express';
import type { ServedExhibitFile } from './exhibits.service';

/**
 * Sends an exhibit file with headers that keep a browser from treating it as anything but what
 * the roll says: exact type, no sniffing, a sandbox with nothing allowed, and non-images as
 * downloads. The bytes never change for a (lot, entry, variant), so the hash is the ETag.
 */
export function sendExhibitFile(
  req: Request,
  res: Response,
  served: ServedExhibitFile,
  shared: boolean,
): void {
  const { file } = served;
  const etag = `"${file.sha256}"`;
  res.setHeader('Content-Type', file.mediaType);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader(
    'Cache-Control',
    shared ? 'public, max-age=31536000, immutable' : 'private, max-age=31536000, immutable',
  );
  res.setHeader('ETag', etag);
  res.setHeader(
    'Content-Disposition',
    `${file.mediaType.startsWith('image/') ? 'inline' : 'attachment'}; filename="${served.downloadName}"`,
  );
  if (req.headers['if-none-match'] === etag) {
    served.stream.destroy();
    res.status(304).end();
    return;
  }
  res.setHeader('Content-Length', String(file.size));
  if (req.method === 'HEAD') {
    served.stream.destroy();
    res.end();
    return;
  }
  served.stream.on('error', () => res.destroy());
  served.stream.pipe(res);
}
