// The estimate queue's deadlock handling (lib/estimate-server/queue.ts): MariaDB picks one
// transaction of a deadlock, rolls it back and answers error 1213 ER_LOCK_DEADLOCK, SQLSTATE
// 40001, "Deadlock found when trying to get lock; try restarting transaction" (the text the
// server sent in the two-process test, tests/integration/estimate-cluster.test.ts). The MySQL
// 8.4 Reference Manual, 17.7.5.3 "How to Minimize and Handle Deadlocks": applications must be
// "always prepared to re-issue a transaction if it gets rolled back because of a deadlock".
// mysql2 reports it as code/errno on its error, and drizzle wraps that error as the `cause` of
// its own "Failed query" error: the shape the app server logged, and the one tested here.
import { describe, expect, it } from 'vitest';
import { isDeadlock, retryDeadlocks } from '@/lib/estimate-server/queue';

const mysqlDeadlock = () =>
  Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), { code: 'ER_LOCK_DEADLOCK', errno: 1213, sqlState: '40001' });
const drizzleWrapped = (cause: Error) => Object.assign(new Error('Failed query: insert into `job_events` …'), { cause });

describe('isDeadlock', () => {
  it('finds error 1213 on the error or in its causes', () => {
    expect(isDeadlock(mysqlDeadlock())).toBe(true);
    expect(isDeadlock(drizzleWrapped(mysqlDeadlock()))).toBe(true);
  });
  it('is false for other errors: a lock wait timeout (1205) and a duplicate key (1062) are not re-run', () => {
    expect(isDeadlock(Object.assign(new Error('Lock wait timeout exceeded'), { code: 'ER_LOCK_WAIT_TIMEOUT', errno: 1205 }))).toBe(false);
    expect(isDeadlock(drizzleWrapped(Object.assign(new Error('Duplicate entry'), { code: 'ER_DUP_ENTRY', errno: 1062 })))).toBe(false);
    expect(isDeadlock(undefined)).toBe(false);
  });
});

describe('retryDeadlocks', () => {
  it('runs the transaction again after a deadlock and answers its result', async () => {
    let runs = 0;
    const answer = await retryDeadlocks(async () => {
      runs++;
      if (runs < 3) throw drizzleWrapped(mysqlDeadlock());
      return 'stored';
    });
    expect(answer).toBe('stored');
    expect(runs).toBe(3);
  });
  it('gives up after the given number of runs with the last error', async () => {
    let runs = 0;
    await expect(
      retryDeadlocks(async () => {
        runs++;
        throw drizzleWrapped(mysqlDeadlock());
      }, 3),
    ).rejects.toThrow(/Failed query/);
    expect(runs).toBe(3);
  });
  it('never re-runs on any other error', async () => {
    let runs = 0;
    await expect(
      retryDeadlocks(async () => {
        runs++;
        throw new Error('the object is missing from storage');
      }),
    ).rejects.toThrow(/missing/);
    expect(runs).toBe(1);
  });
});
