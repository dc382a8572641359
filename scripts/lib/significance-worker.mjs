// Worker thread of `npm run bench:significance`: loads the TypeScript job through tsx (as the pipeline's
// metrics threads do) and answers each message with its result.
import { parentPort } from "node:worker_threads";
import { tsImport } from "tsx/esm/api";

const job = await tsImport("./significance-job.ts", import.meta.url);
parentPort.on("message", (task) => {
  parentPort.postMessage(job.runJob(task));
});
parentPort.postMessage({ ready: true });
