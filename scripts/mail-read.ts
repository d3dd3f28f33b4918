// `npm run mail:list`: prints the mail captured by the local SMTP fake, newest last.
// `npm run mail:list -- --clear` empties the capture first; `--json` prints raw JSON.
const base = process.env.MAIL_CAPTURE_URL || `http://127.0.0.1:${process.env.KERFCAST_MAIL_HTTP_PORT || 8025}`;

interface Captured {
  date: string | null;
  from: string | null;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string | null; size: number }[];
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  if (args.includes('--clear')) {
    const res = await fetch(`${base}/messages`, { method: 'DELETE' });
    console.log(`cleared: ${JSON.stringify(await res.json())}`);
    return;
  }
  const res = await fetch(`${base}/messages`);
  const messages = (await res.json()) as Captured[];
  if (args.includes('--json')) {
    console.log(JSON.stringify(messages, null, 2));
    return;
  }
  if (messages.length === 0) console.log('no captured mail');
  for (const m of messages) {
    console.log(`— ${m.date ?? '?'}  from ${m.from ?? '?'}  to ${m.to.join(', ')}`);
    console.log(`  subject: ${m.subject}`);
    if (m.attachments.length) console.log(`  attachments: ${m.attachments.map((a) => `${a.filename} (${a.size} B)`).join(', ')}`);
    console.log(
      m.text
        .trim()
        .split('\n')
        .map((l) => `  | ${l}`)
        .join('\n'),
    );
  }
}

main().catch((err: unknown) => {
  console.error(`mail:list: cannot reach the mail capture at ${base} (${err instanceof Error ? err.message : String(err)}); is scripts/services-start.sh running?`);
  process.exit(1);
});
