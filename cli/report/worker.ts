import { parentPort } from 'node:worker_threads';
import { analyseSample, type SampleTask } from './analyse.js';

// A worker thread of the report: analyses each sample it is sent and posts the outcome back.
parentPort?.on('message', (task: SampleTask) => {
  parentPort?.postMessage(analyseSample(task));
});
