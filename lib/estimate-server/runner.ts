// One server process's share of the estimate queue: a piscina pool of worker threads and
// the loop that feeds it. The loop claims only as many rows as the pool has free threads,
// renews the leases of the rows it runs, writes each result while it still holds the row,
// and looks for work when woken (a request in this process), when a task ends, and every
// few seconds (requests answered by other processes, leases that ran out).
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { Db } from '@/db/client';
import { claimEstimates, completeEstimate, failEstimate, releaseEstimates, renewLeases, requeueDeadLocalOwners, setProgress, type ClaimedEstimate } from './queue';
import { setHoldMethodsKey } from './hold-methods-key';
import { holdMethodsKeyFor, reportKeyFor, type EstimateTask, type EstimateTaskOutcome } from './task';

export interface EstimateQueueOptions {
  db: Db;
  /** the bundled worker (scripts/build-estimate-worker.mjs) */
  workerFile: string;
  poolSize: number;
  /** how long a claim holds a row without renewal */
  leaseMs?: number;
  renewMs?: number;
  pollMs?: number;
  log?: (message: string, error?: unknown) => void;
}

/** How long a worker thread beyond the first may wait for its next estimate before it ends. */
export const IDLE_THREAD_MS = 60_000;

interface Running {
  claimed: ClaimedEstimate;
  abort: AbortController;
  /** set when the lease was lost: the result is dropped */
  lost: boolean;
}

/** A name no other process uses: host, pid and a random part (a restarted process may get the same pid). */
export function leaseOwnerName(host: string = os.hostname()): string {
  return `${host.slice(0, 50)}:${process.pid}:${randomBytes(4).toString('hex')}`;
}

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: it lives, under another user
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export class EstimateQueue {
  readonly owner: string;
  readonly host: string;
  private readonly db: Db;
  private readonly pool: Piscina;
  private readonly poolSize: number;
  private readonly leaseMs: number;
  private readonly renewMs: number;
  private readonly pollMs: number;
  private readonly log: (message: string, error?: unknown) => void;
  private readonly running = new Map<number, Running>();
  private timers: NodeJS.Timeout[] = [];
  private claiming = false;
  private wakeAgain = false;
  private stopped = false;

  constructor(options: EstimateQueueOptions) {
    this.host = os.hostname();
    this.owner = leaseOwnerName(this.host);
    this.db = options.db;
    this.poolSize = Math.max(1, Math.floor(options.poolSize));
    this.leaseMs = options.leaseMs ?? 30_000;
    this.renewMs = options.renewMs ?? Math.max(250, Math.floor(this.leaseMs / 3));
    this.pollMs = options.pollMs ?? 5_000;
    this.log = options.log ?? ((message, error) => console.error(`[kerfcast] estimate queue: ${message}`, error ?? ''));
    this.pool = new Piscina({
      filename: options.workerFile,
      maxThreads: this.poolSize,
      // One thread stays started: its engine code is loaded and compiled (WebAssembly, and
      // the JIT's work on the hot loops, which made later estimates of the 1,000,000-line
      // nest up to 40% faster than the first in the benchmark). Ending threads does not give
      // their memory back to the system either: the process keeps freed memory for reuse.
      // Threads beyond the first end after IDLE_THREAD_MS without work.
      minThreads: 1,
      idleTimeout: IDLE_THREAD_MS,
      // the task awaits object storage: no thread may be parked between tasks
      atomics: 'disabled',
    });
  }

  /** Puts back rows an earlier life of this process left running, then starts looking for work. */
  async start(): Promise<void> {
    const poll = setInterval(() => this.wake(), this.pollMs);
    const renew = setInterval(() => void this.renew(), this.renewMs);
    poll.unref();
    renew.unref();
    this.timers.push(poll, renew);
    try {
      const requeued = await requeueDeadLocalOwners(this.db, this.host, this.owner, pidAlive);
      if (requeued > 0) console.log(`[kerfcast] estimate queue: ${requeued} estimate(s) left running by a stopped process queued again`);
    } catch (err) {
      // the database may come up after the app: the poll keeps trying, leases still run out
      this.log('queueing again what a stopped process left running failed', err);
    }
    this.wake();
  }

  /** Look for work now; calls while a claim is under way make it look once more afterwards. */
  wake(): void {
    if (this.stopped) return;
    if (this.claiming) {
      this.wakeAgain = true;
      return;
    }
    void this.claim();
  }

  get busy(): number {
    return this.running.size;
  }

  private async claim(): Promise<void> {
    this.claiming = true;
    try {
      do {
        this.wakeAgain = false;
        const free = this.poolSize - this.running.size;
        if (free <= 0 || this.stopped) break;
        const claimed = await claimEstimates(this.db, this.owner, free, this.leaseMs);
        for (const row of claimed) this.run(row);
        // a full claim may have left more rows waiting: look again
        if (claimed.length === free) this.wakeAgain = true;
      } while (this.wakeAgain && !this.stopped);
    } catch (err) {
      this.log('claiming estimates failed; trying again at the next poll', err);
    } finally {
      this.claiming = false;
    }
  }

  private run(claimed: ClaimedEstimate): void {
    const entry: Running = { claimed, abort: new AbortController(), lost: false };
    this.running.set(claimed.id, entry);
    const channel = new MessageChannel();
    channel.port1.on('message', (message: { progress?: number }) => {
      if (typeof message.progress === 'number' && !entry.lost) {
        setProgress(this.db, this.owner, claimed.id, message.progress).catch((err) => this.log(`progress of estimate ${claimed.id}`, err));
      }
    });
    const task: EstimateTask = {
      estimateId: claimed.id,
      shopId: claimed.shopId,
      objectKey: claimed.objectKey,
      fileName: claimed.fileName,
      sha256: claimed.sha256,
      profile: claimed.profile,
      settings: claimed.settings,
      reportKey: reportKeyFor(claimed.shopId, claimed.id),
      holdMethodsKey: holdMethodsKeyFor(claimed.shopId, claimed.id),
      progressPort: channel.port2,
    };
    const work = this.pool.run(task, { signal: entry.abort.signal, transferList: [channel.port2] }) as Promise<EstimateTaskOutcome>;
    work
      .then(
        async (outcome) => {
          if (entry.lost || this.stopped) {
            // every computation that ran to its end leaves a line, stored or not
            if (outcome.ok) this.log(`estimate ${claimed.id} was computed after this process lost its lease or began to stop; this result is dropped`);
            return;
          }
          if (outcome.ok) {
            // written while the row is still running under this lease, so a reader of a done
            // estimate finds its key; a row taken over meanwhile is computed (and keyed) again
            await setHoldMethodsKey(this.db, this.owner, claimed.id, outcome.holdMethodsKey ?? null);
            const stored = await completeEstimate(this.db, this.owner, claimed, outcome);
            if (!stored) this.log(`estimate ${claimed.id} was taken over by another process before it finished here; this result is dropped`);
            else {
              const p = outcome.phasesMs;
              console.log(`[kerfcast] estimate ${claimed.id} stored: ${outcome.computeMs} ms in the worker (read ${p.read}, engine ${p.engine}, hold-down methods ${p.holdMethods ?? 0}, report ${p.store}), report ${outcome.reportBytes} bytes`);
            }
          } else {
            await failEstimate(this.db, this.owner, claimed.id, outcome.reason);
          }
        },
        async (err: unknown) => {
          if (entry.lost || this.stopped) return;
          // the thread itself died (out of memory, a crash in the engine's WebAssembly)
          const reason = `The estimate's worker thread stopped before it finished: ${(err as Error)?.message ?? String(err)}`;
          await failEstimate(this.db, this.owner, claimed.id, reason);
        },
      )
      .catch((err) => this.log(`storing the outcome of estimate ${claimed.id} failed; its lease will run out and it will run again`, err))
      .finally(() => {
        channel.port1.close();
        this.running.delete(claimed.id);
        this.wake();
      });
  }

  private async renew(): Promise<void> {
    const ids = [...this.running.keys()];
    if (ids.length === 0) return;
    try {
      const held = new Set(await renewLeases(this.db, this.owner, ids, this.leaseMs));
      for (const id of ids) {
        const entry = this.running.get(id);
        if (entry && !held.has(id)) {
          // another process took the row over (this one was too slow to renew): stop computing it
          entry.lost = true;
          entry.abort.abort();
          this.log(`lost the lease of estimate ${id}; another process has it now`);
        }
      }
    } catch (err) {
      this.log('renewing leases failed; trying again shortly', err);
    }
  }

  /** Stops claiming, ends the threads and puts unfinished rows back in the queue. */
  async stop(): Promise<void> {
    if (this.stopped) return;
    this.stopped = true;
    for (const t of this.timers) clearInterval(t);
    this.timers = [];
    const ids = [...this.running.keys()];
    for (const entry of this.running.values()) entry.abort.abort();
    try {
      await releaseEstimates(this.db, this.owner, ids);
    } catch (err) {
      this.log('putting unfinished estimates back failed; their leases will run out', err);
    }
    await this.pool.destroy();
  }
}
