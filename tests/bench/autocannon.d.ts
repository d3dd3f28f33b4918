// The part of autocannon's API the server benchmark uses (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Options {
      url: string;
      connections?: number;
      amount?: number;
      duration?: number;
      /** seconds */
      timeout?: number;
      headers?: Record<string, string>;
    }
    interface Stats {
      average: number;
      p50: number;
      p90: number;
      p97_5: number;
      p99: number;
    }
    interface Result {
      requests: Stats;
      latency: Stats;
      non2xx: number;
      errors: number;
      timeouts: number;
    }
    interface Instance {
      on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTimeMs: number) => void): void;
    }
  }
  function autocannon(options: autocannon.Options, done: (err: Error | null, result: autocannon.Result) => void): autocannon.Instance;
  export = autocannon;
}
