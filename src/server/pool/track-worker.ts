/**
 * Entry of a generation worker thread: says `ready` once the core is loaded, then answers one
 * task at a time. The pool (track-pool.ts) owns its lifecycle.
 */
import { parentPort } from 'node:worker_threads';
import type { TaskMessage, WorkerMessage } from './protocol.js';
import { runTask } from './tasks.js';

if (parentPort === null) throw new Error('track-worker runs only as a worker thread (new Worker(...)), not as a script');
const port = parentPort;

// one task at a time: the pool sends the next only after this one's result
port.on('message', async (message: TaskMessage) => {
  const { output, transfer } = await runTask(message.input);
  const reply: WorkerMessage = { type: 'result', taskId: message.taskId, output };
  port.postMessage(reply, transfer);
});

const ready: WorkerMessage = { type: 'ready' };
port.postMessage(ready);
