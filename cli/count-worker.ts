/**
 * One worker of `count --jobs N` (count-batch.ts): loads its own opencv.js, says it is ready, then
 * reads the photo it is sent, answers with the outcome, and waits for the next.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { countOne, type PhotoSettings, type WorkerReply } from './count-batch.ts';
import { loadCvCore } from './opencv-quiet.ts';

const settings = workerData as PhotoSettings;
const core = await loadCvCore();
const port = parentPort!;
port.on('message', async ({ index, file }: { index: number; file: string }) => {
  const reply: WorkerReply = { index, outcome: await countOne(core, file, settings) };
  port.postMessage(reply);
});
port.postMessage({ ready: true } satisfies WorkerReply);
