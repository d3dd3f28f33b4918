// The local fakes refuse what a web page in the developer's browser could send them
// (issue 18 finding 10; OWASP ASVS 4.0.3 V14.1). A second set of the two fakes runs in a
// scratch folder on free ports (as tests/integration/services-scripts.test.ts does), so
// the shared services are not touched. The requests are written with node:http, which
// lets a test set Host and Origin the way a rebound page or a form would. S3 behaviour
// per the Amazon S3 API reference (PutObject, DeleteObject, POST Object browser uploads).
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../..');
const BUCKET = 'kerfcast-programs';

function run(script: string, env: Record<string, string>): Promise<{ code: number | null; output: string }> {
  const child = spawn('bash', [path.join(ROOT, 'scripts', script)], { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout.on('data', (d: Buffer) => (output += d));
  child.stderr.on('data', (d: Buffer) => (output += d));
  return new Promise((resolve) => child.on('exit', (code) => resolve({ code, output })));
}

async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

function raw(port: number, method: string, pathName: string, headers: Record<string, string>, body?: string): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request({ host: '127.0.0.1', port, method, path: pathName, headers: { host: `127.0.0.1:${port}`, ...headers } }, (res) => {
      let text = '';
      res.on('data', (d: Buffer) => (text += d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
    });
    req.on('error', reject);
    req.end(body);
  });
}

let scratch: string;
let env: Record<string, string>;
let s3Port: number;
let mailPort: number;

beforeAll(async () => {
  scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'kerfcast-fakes-'));
  s3Port = await freePort();
  mailPort = await freePort();
  env = {
    KERFCAST_DATA_DIR: scratch,
    KERFCAST_SERVICES: 's3-fake smtp-fake',
    KERFCAST_S3_PORT: String(s3Port),
    KERFCAST_SMTP_PORT: String(await freePort()),
    KERFCAST_MAIL_HTTP_PORT: String(mailPort),
  };
  const started = await run('services-start.sh', env);
  expect(started.code, started.output).toBe(0);
}, 60_000);

afterAll(async () => {
  if (scratch) {
    await run('services-stop.sh', env);
    fs.rmSync(scratch, { recursive: true, force: true });
  }
});

describe('S3 fake (ASVS V14.1)', () => {
  it('still serves the SDK, signed, as the app uses it', async () => {
    const s3 = new S3Client({ endpoint: `http://127.0.0.1:${s3Port}`, region: 'us-east-1', forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } });
    await s3.send(new PutObjectCommand({ Bucket: BUCKET, Key: 'guard/ok.nc', Body: 'G0 X0\n' }));
    const got = await s3.send(new GetObjectCommand({ Bucket: BUCKET, Key: 'guard/ok.nc' }));
    expect(await got.Body?.transformToString()).toBe('G0 X0\n');
    await s3.send(new DeleteObjectCommand({ Bucket: BUCKET, Key: 'guard/ok.nc' }));
    // a multipart upload of a program as the upload route sends it: CreateMultipartUpload is
    // a signed POST naming text/plain, which the form-post refusal must let through
    const big = Buffer.alloc(6 * 1024 * 1024, 'G1 X1 Y1\n');
    await new Upload({ client: s3, params: { Bucket: BUCKET, Key: 'guard/big.nc', Body: big, ContentType: 'text/plain; charset=utf-8' }, partSize: 5 * 1024 * 1024 }).done();
    const back = await s3.send(new GetObjectCommand({ Bucket: BUCKET, Key: 'guard/big.nc' }));
    expect((await back.Body?.transformToByteArray())?.length).toBe(big.length);
    await s3.send(new DeleteObjectCommand({ Bucket: BUCKET, Key: 'guard/big.nc' }));
    s3.destroy();
  });

  it('refuses an unsigned upload and an unsigned delete', async () => {
    expect((await raw(s3Port, 'PUT', `/${BUCKET}/guard/unsigned.nc`, { 'content-type': 'text/plain' }, 'M30')).status).toBe(403);
    expect((await raw(s3Port, 'DELETE', `/${BUCKET}/guard/unsigned.nc`, {})).status).toBe(403);
    expect(fs.existsSync(path.join(scratch, 's3', BUCKET, 'guard'))).toBe(false);
  });

  it('refuses a browser-style form post, even one that names an Authorization', async () => {
    const form = '--b\r\nContent-Disposition: form-data; name="key"\r\n\r\nguard/form.nc\r\n--b\r\nContent-Disposition: form-data; name="file"; filename="x.nc"\r\n\r\nM30\r\n--b--\r\n';
    const posted = await raw(s3Port, 'POST', `/${BUCKET}`, { 'content-type': 'multipart/form-data; boundary=b', origin: 'https://page.example' }, form);
    expect(posted.status).toBe(403);
    const signedLooking = await raw(s3Port, 'POST', `/${BUCKET}`, { 'content-type': 'multipart/form-data; boundary=b', authorization: 'AWS4-HMAC-SHA256 Credential=S3RVER/x' }, form);
    expect(signedLooking.status).toBe(403);
    // a text/plain form post (no Authorization header: a form cannot send one) is refused too
    const plain = await raw(s3Port, 'POST', `/${BUCKET}/guard/plain.nc?uploads=`, { 'content-type': 'text/plain' }, 'M30');
    expect(plain.status).toBe(403);
  });

  it('refuses a Host that is not its loopback address and port (DNS rebinding)', async () => {
    expect((await raw(s3Port, 'GET', '/', { host: `rebound.example:${s3Port}` })).status).toBe(403);
  });
});

describe('mail capture API (ASVS V14.1)', () => {
  it('lists captured mail for a script on loopback, also through Node\'s fetch', async () => {
    const answer = await raw(mailPort, 'GET', '/messages', {});
    expect(answer.status).toBe(200);
    expect(JSON.parse(answer.text)).toEqual([]);
    // undici sends Sec-Fetch-Mode: cors of its own; the tests and scripts use it
    expect((await fetch(`http://127.0.0.1:${mailPort}/messages`)).status).toBe(200);
  });

  it('refuses a rebound Host and a browser Origin', async () => {
    expect((await raw(mailPort, 'GET', '/messages', { host: `rebound.example:${mailPort}` })).status).toBe(403);
    expect((await raw(mailPort, 'GET', '/messages', { origin: 'https://page.example' })).status).toBe(403);
    expect((await raw(mailPort, 'DELETE', '/messages', { host: `rebound.example:${mailPort}` })).status).toBe(403);
  });
});
