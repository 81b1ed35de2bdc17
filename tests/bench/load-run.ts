/**
 * One load run for bench:api, in a process of its own (so the load does not share the event loop
 * of the servers it measures): autocannon on one URL, with the median response time worked out
 * from every 2xx response's own time. autocannon's summary keeps latencies in whole milliseconds,
 * which makes a p50 ratio of two endpoints answering in 1–3 ms mostly rounding.
 *
 * Usage: tsx tests/bench/load-run.ts '<json of LoadRunOptions>' — prints a LoadRunResult as JSON.
 */
import autocannon from 'autocannon';

export interface LoadRunOptions {
  url: string;
  connections: number;
  headers: Record<string, string>;
  /** Run for this many seconds, or until this many requests have been answered. */
  seconds?: number;
  amount?: number;
}

export interface LoadRunResult {
  requests: number;
  durationS: number;
  /** Median response time of the 2xx answers, in milliseconds (fractions kept). */
  p50Ms: number;
  bad: number;
}

/** The median of a list of numbers (the mean of the middle two for an even count). */
function median(values: number[]): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

async function run(options: LoadRunOptions): Promise<LoadRunResult> {
  const times: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: options.url,
        connections: options.connections,
        headers: options.headers,
        timeout: 60,
        ...(options.amount ? { amount: options.amount } : { duration: options.seconds ?? 1 }),
      },
      (err, finished) => (err ? reject(err) : resolve(finished)),
    );
    instance.on('response', (_client, statusCode, _bytes, responseTime) => {
      if (statusCode >= 200 && statusCode < 300) times.push(responseTime);
    });
  });
  return { requests: result.requests.total, durationS: result.duration, p50Ms: median(times), bad: result.non2xx + result.errors };
}

process.stdout.write(JSON.stringify(await run(JSON.parse(process.argv[2]!) as LoadRunOptions)));
