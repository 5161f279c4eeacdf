/**
 * The worker thread of a report run: analyses the samples it is sent, one at a time, and posts
 * each outcome back.
 */

import { parentPort } from 'node:worker_threads';
import { analyseSample, type SampleTask } from './analyse.js';

parentPort?.on('message', (task: SampleTask) => {
  parentPort?.postMessage(analyseSample(task));
});
