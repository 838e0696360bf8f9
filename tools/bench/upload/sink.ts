// The baseline: a bare Node HTTP server that writes each request body to a file and answers,
// so the ratio shows what the exhibit pipeline adds over just moving the bytes.
import { createWriteStream, mkdirSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';

export async function startSink(dir: string): Promise<{ url: string; server: Server }> {
  mkdirSync(dir, { recursive: true });
  let n = 0;
  const server = createServer((req, res) => {
    pipeline(req, createWriteStream(join(dir, `body-${n++}`)))
      .then(() => res.writeHead(201, { 'Content-Type': 'application/json' }).end('{}'))
      .catch(() => res.writeHead(500).end());
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const addr = server.address();
  if (!addr || typeof addr === 'string') throw new Error('no sink address');
  return { url: `http://127.0.0.1:${addr.port}`, server };
}
