/**
 * Runs the analyses of a report's samples: in worker threads when that helps, else in this
 * thread, with progress on stderr; outcomes come back in the order of the samples.
 */

import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { type Io, progress } from '../io.js';
import { analyseSample, type SampleOutcome, type SampleTask } from './analyse.js';

/** Options of {@link runSamples}. */
export interface RunOptions {
  /** Largest number of worker threads. @default the machine's available parallelism, at most 4 */
  readonly jobs?: number;
}

/** Most worker threads by default: more rarely pays for their start-up on a report of a few samples. */
export const DEFAULT_MAX_JOBS = 4;

/**
 * Analyses every sample, in worker threads when there is more than one sample and more than one
 * job allowed, else in this thread; outcomes come back in the order of the tasks. A sample whose
 * worker fails is reported as failed and the others still finish. Workers need the compiled
 * `worker.js` beside this module; run from the TypeScript sources (the test suite), the samples
 * are analysed in this thread instead.
 */
export async function runSamples(
  tasks: readonly SampleTask[],
  io: Io,
  options: RunOptions = {},
): Promise<SampleOutcome[]> {
  const jobs = Math.max(
    1,
    // More threads than cores only cost memory.
    Math.min(options.jobs ?? DEFAULT_MAX_JOBS, availableParallelism(), tasks.length),
  );
  const script = new URL('./worker.js', import.meta.url);
  const bar = progress(io, `report: ${tasks.length} sample${tasks.length === 1 ? '' : 's'}`);
  let done = 0;
  const tick = () => {
    done += 1;
    bar.update(done, tasks.length);
  };
  try {
    if (jobs === 1 || !existsSync(fileURLToPath(script))) {
      const outcomes: SampleOutcome[] = [];
      for (const t of tasks) {
        outcomes.push(analyseSample(t));
        tick();
        // A turn of the event loop between samples, so that Ctrl-C is handled without waiting for all.
        await new Promise((res) => setImmediate(res));
      }
      return outcomes;
    }
    const outcomes = new Array<SampleOutcome | undefined>(tasks.length);
    let next = 0;
    await Promise.all(
      Array.from({ length: jobs }, async () => {
        let worker = new Worker(script);
        try {
          while (next < tasks.length) {
            const i = next++;
            const task = tasks[i] as SampleTask;
            const { outcome, crashed } = await inWorker(worker, task);
            outcomes[i] = outcome;
            tick();
            // A worker that failed is gone; the remaining samples get a fresh one.
            if (crashed) {
              await worker.terminate();
              worker = new Worker(script);
            }
          }
        } finally {
          await worker.terminate();
        }
      }),
    );
    return outcomes.map((o, i) => o ?? failed(tasks[i] as SampleTask, 'not analysed'));
  } finally {
    bar.end();
  }
}

function failed(task: SampleTask, error: string): SampleOutcome {
  return { ok: false, name: task.sample.name, slug: task.slug, error };
}

function inWorker(worker: Worker, task: SampleTask): Promise<{ outcome: SampleOutcome; crashed: boolean }> {
  return new Promise((resolve) => {
    const onMessage = (outcome: SampleOutcome) => {
      cleanup();
      resolve({ outcome, crashed: false });
    };
    const onError = (e: Error) => {
      cleanup();
      resolve({ outcome: failed(task, `internal error in the worker: ${e.message}`), crashed: true });
    };
    const cleanup = () => {
      worker.off('message', onMessage);
      worker.off('error', onError);
    };
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.postMessage(task);
  });
}
