import { useEffect } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { Alert } from "../../../components/ui/form";
import { useCurrentBatch } from "../api/get-current-batch";
import { pipelineKeys } from "../api/keys";
import { BatchHistory } from "./batch-history";
import { BatchProgressCard } from "./batch-progress";
import { QueuePanel } from "./queue-panel";
import { PipelineSettingsForm } from "./settings-form";

/** The admin's metrics pipeline page: networks queued by publishing, current batch with live progress, settings, history. */
export function PipelineAdmin() {
  const current = useCurrentBatch();
  const batch = current.data?.batch ?? null;
  const running = batch?.status === "running";
  const qc = useQueryClient();
  // When a batch changes state (e.g. finishes), refresh its history row and failures once more.
  const stateKey = batch ? `${batch.id}:${batch.status}` : "";
  useEffect(() => {
    if (stateKey) void qc.invalidateQueries({ queryKey: pipelineKeys.batches(), refetchType: "active", exact: false, predicate: (q) => q.queryKey[2] !== "current" });
  }, [stateKey, qc]);
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-bold text-moss-700">Metrics pipeline</h1>
        <p className="mt-1 max-w-3xl text-stone-700">
          Every published network is analysed by one reproducible pipeline: size and connectance, optimized modularity with its partition, node roles,
          NODF, and significance against null replicates optimized with the same effort. Networks are queued when they are published; a batch recomputes the
          whole catalogue with new settings. Workers started with <code className="font-mono text-sm">npm run worker</code> on other machines share the work.
        </p>
      </div>
      <QueuePanel batchRunning={running} />
      {current.error && <Alert tone="error">{current.error.message}</Alert>}
      {batch ? (
        <BatchProgressCard batch={batch} />
      ) : (
        current.data && <Alert tone="info">No batch has been started yet.</Alert>
      )}
      <PipelineSettingsForm batchRunning={running} />
      <BatchHistory polling={running} />
    </div>
  );
}
