/** Worker thread for significance.test.ts: computes a chunk of null replicates, as the server's pool would. */
import { parentPort, workerData } from "node:worker_threads";
import { nullReplicateQ } from "@shared/network/significance";
import { deserializeNetwork } from "@shared/network/parse/index";

const { network, settings, replicates } = workerData as {
  network: unknown;
  settings: Parameters<typeof nullReplicateQ>[1];
  replicates: number[];
};
const net = deserializeNetwork(network);
parentPort!.postMessage(replicates.map((r) => [r, nullReplicateQ(net, { ...settings, replicate: r })]));
