/**
 * One worker of `count --jobs N` (count-pool.ts): loads its own opencv.js, then takes photos from
 * the batch's shared queue one after another and answers with each outcome, until none are left.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { countOne } from './count-one.ts';
import { PhotoQueue, type WorkerInput, type WorkerReply } from './count-pool.ts';
import { loadCvCore } from './opencv-quiet.ts';

const { files, settings, queue: shared, slot } = workerData as WorkerInput;
const queue = new PhotoQueue(files.length, shared);
const core = await loadCvCore();
for (let index = queue.take(slot); index >= 0; index = queue.take(slot)) {
  const reply: WorkerReply = { index, outcome: await countOne(core, files[index]!, settings) };
  parentPort!.postMessage(reply);
}
