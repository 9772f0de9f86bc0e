/**
 * A worker of the count pool that stops, as a worker whose opencv.js aborts would, on any photo
 * whose name holds "crash" (count-pool.test.ts). Other photos it reads as the real worker does.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { countOne } from '../../cli/count-one.ts';
import { PhotoQueue, type WorkerInput, type WorkerReply } from '../../cli/count-pool.ts';
import { loadCvCore } from '../../cli/opencv-quiet.ts';

const { files, settings, queue: shared, slot } = workerData as WorkerInput;
const queue = new PhotoQueue(files.length, shared);
const core = await loadCvCore();
for (let index = queue.take(slot); index >= 0; index = queue.take(slot)) {
  if (files[index]!.includes('crash')) throw new Error(`stopped on ${files[index]}`);
  const reply: WorkerReply = { index, outcome: await countOne(core, files[index]!, settings) };
  parentPort!.postMessage(reply);
}
