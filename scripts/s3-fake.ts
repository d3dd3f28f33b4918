// Local stand-in for the hosted S3 bucket: s3rver on loopback, data in .data/s3, the
// bucket kerfcast-programs created at start. The app reaches it only through
// @aws-sdk/client-s3 (lib/storage/s3.ts), exactly as it reaches the real service.
import { createRequire } from 'node:module';
import fs from 'node:fs';
import path from 'node:path';
import { dataDir, portFromEnv, writePidFile } from './lib/pid-file';

interface S3rverOptions {
  address: string;
  port: number;
  directory: string;
  silent: boolean;
  configureBuckets: { name: string; configs: string[] }[];
}
interface S3rverInstance {
  run(): Promise<{ address: string; port: number }>;
  close(): Promise<void>;
}

// s3rver ships no type declarations; the two methods used are typed above.
const S3rver = createRequire(__filename)('s3rver') as new (options: S3rverOptions) => S3rverInstance;

const port = portFromEnv('KERFCAST_S3_PORT', 4569);
const bucket = process.env.S3_BUCKET || 'kerfcast-programs';
const directory = path.join(dataDir, 's3');
fs.mkdirSync(directory, { recursive: true });

const server = new S3rver({
  address: '127.0.0.1',
  port,
  directory,
  silent: false,
  configureBuckets: [{ name: bucket, configs: [] }],
});

server
  .run()
  .then(() => {
    writePidFile('s3-fake', () => server.close());
    console.log(`s3-fake: listening on http://127.0.0.1:${port}, bucket ${bucket}, data ${directory}`);
  })
  .catch((err: unknown) => {
    console.error('s3-fake: could not start:', err);
    process.exit(1);
  });
