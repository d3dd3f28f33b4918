// Local stand-in for the hosted S3 bucket: s3rver on loopback, data in .data/s3, the
// buckets kerfcast-programs (demo) and kerfcast-programs-test (npm test) created at start. The app reaches it only through
// @aws-sdk/client-s3 (lib/storage/s3.ts), exactly as it reaches the real service. In
// front of s3rver, scripts/lib/fake-guard.ts refuses what a web page could send:
// another Host, a browser's request, a form upload, anything unsigned.
import { createRequire } from 'node:module';
import fs from 'node:fs';
import path from 'node:path';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { s3Refusal } from './lib/fake-guard';
import { dataDir, portFromEnv, writePidFile } from './lib/pid-file';

interface S3rverOptions {
  address: string;
  port: number;
  directory: string;
  silent: boolean;
  configureBuckets: { name: string; configs: string[] }[];
}
type Handler = (req: IncomingMessage, res: ServerResponse) => void;
interface S3rverInstance {
  run(): Promise<{ address: string; port: number }>;
  close(): Promise<void>;
  /** Koa's request handler; s3rver's listen() attaches what this returns */
  callback(): Handler;
}

// s3rver ships no type declarations; the two methods used are typed above.
const S3rver = createRequire(__filename)('s3rver') as new (options: S3rverOptions) => S3rverInstance;

const port = portFromEnv('KERFCAST_S3_PORT', 4569);
// The demo bucket and the test bucket (scripts/test.sh) both exist whichever script started
// the fake first, plus S3_BUCKET when it names another.
const buckets = [...new Set(['kerfcast-programs', 'kerfcast-programs-test', process.env.S3_BUCKET || 'kerfcast-programs'])];
const directory = path.join(dataDir, 's3');
fs.mkdirSync(directory, { recursive: true });

const server = new S3rver({
  address: '127.0.0.1',
  port,
  directory,
  silent: false,
  configureBuckets: buckets.map((name) => ({ name, configs: [] })),
});

// s3rver extends Koa and serves callback()'s handler: the guard goes in front of it.
const koaCallback = server.callback.bind(server);
server.callback = () => {
  const inner = koaCallback();
  return (req, res) => {
    const refusal = s3Refusal(req, port);
    if (!refusal) return inner(req, res);
    res.writeHead(403, { 'content-type': 'text/plain; charset=utf-8' });
    res.end(`s3-fake: ${refusal}\n`);
  };
};

server
  .run()
  .then(() => {
    writePidFile('s3-fake', () => server.close());
    console.log(`s3-fake: listening on http://127.0.0.1:${port}, buckets ${buckets.join(', ')}, data ${directory}`);
  })
  .catch((err: unknown) => {
    console.error('s3-fake: could not start:', err);
    process.exit(1);
  });
