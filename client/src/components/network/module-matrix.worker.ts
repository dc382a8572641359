/// <reference lib="webworker" />
/** Builds the matrix image off the main thread, so a 3000 × 5000 network never blocks the page. */
import { buildMatrixImage, type MatrixInput } from "@shared/plots/matrix-image";

export interface MatrixRequest extends MatrixInput {
  id: number;
}

self.onmessage = (e: MessageEvent<MatrixRequest>) => {
  const { id, ...input } = e.data;
  const img = buildMatrixImage(input);
  (self as unknown as DedicatedWorkerGlobalScope).postMessage({ id, ...img }, [img.pixels.buffer, img.rowOrder.buffer, ...(img.colOrder !== img.rowOrder ? [img.colOrder.buffer] : [])]);
};
