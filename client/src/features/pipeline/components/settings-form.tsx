import { useEffect, useState } from "react";
import { Alert, Button, SelectField, TextField, fieldErrorsOf } from "../../../components/ui/form";
import { ApiClientError } from "../../../lib/api-client";
import type { BatchPreview, PipelineNullModelName, PipelineSettings } from "@shared/types/pipeline";
import { NULL_MODEL_INFO, NULL_MODELS } from "@shared/network/null-models/index";
import { usePreviewBatch } from "../api/preview-batch";
import { usePipelineSettings } from "../api/get-pipeline-settings";
import { useStartBatch } from "../api/start-batch";
import { useUpdatePipelineSettings } from "../api/update-pipeline-settings";

const OBJECTIVES = [
  { value: "auto", label: "Automatic, by network kind" },
  { value: "barber", label: "Barber's bipartite modularity" },
  { value: "newman", label: "Newman–Girvan" },
  { value: "newman-directed", label: "Leicht–Newman (directed)" },
];
const NULL_CHOICES = [
  { value: "standard", label: "Standard set of each kind of data (fixed degrees first)" },
  ...NULL_MODELS.map((m) => ({ value: m, label: `Only: ${NULL_MODEL_INFO[m].title} (${m})` })),
];

function nullChoiceOf(s: PipelineSettings): string {
  return s.nullModels === "standard" ? "standard" : s.nullModels[0];
}
const ANNEALING = [
  { value: "auto", label: "Automatic (small networks only)" },
  { value: "on", label: "Always" },
  { value: "off", label: "Never" },
];

/** The pipeline settings: save them as current, or start a batch over every published network with them. */
export function PipelineSettingsForm({ batchRunning }: { batchRunning: boolean }) {
  const current = usePipelineSettings();
  const save = useUpdatePipelineSettings();
  const start = useStartBatch();
  const [s, setS] = useState<PipelineSettings | null>(null);
  const [force, setForce] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const preview = usePreviewBatch();
  const [confirm, setConfirm] = useState<BatchPreview | null>(null);
  useEffect(() => {
    if (current.data && !s) setS(current.data.settings);
  }, [current.data, s]);

  if (current.error) return <Alert tone="error">{current.error.message}</Alert>;
  if (!s || !current.data) return <p className="text-stone-700">Loading settings…</p>;
  const errors = { ...fieldErrorsOf(save.error), ...Object.fromEntries(Object.entries({ ...fieldErrorsOf(start.error), ...fieldErrorsOf(preview.error) }).map(([k, v]) => [k.replace(/^settings\//, ""), v])) };
  const num = (k: "restarts" | "nulls" | "seed") => (e: React.ChangeEvent<HTMLInputElement>) => setS({ ...s, [k]: e.target.value === "" ? NaN : Number(e.target.value) });
  const d = current.data.defaults;

  return (
    <section aria-labelledby="settings-heading" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
      <h2 id="settings-heading" className="text-lg font-bold text-moss-700">
        Settings
      </h2>
      <p className="mt-1 text-sm text-stone-700">
        The catalogue shows, for each network, the result of the current settings. Results of earlier settings are kept. Engine:{" "}
        <span className="font-mono">{current.data.engineVersion}</span>; settings hash <span className="font-mono">{current.data.settingsHash.slice(0, 12)}</span>.
      </p>
      <form
        className="mt-4 grid gap-4 sm:grid-cols-2"
        onSubmit={(e) => {
          e.preventDefault();
          setNotice(null);
          // A new attempt replaces the last refusal.
          save.reset();
          preview.reset();
          start.reset();
          const submitter = (e.nativeEvent as SubmitEvent).submitter as HTMLButtonElement | null;
          if (submitter?.value === "save") {
            save.mutate(s, { onSuccess: () => setNotice("Settings saved. Start a batch to compute every network with them.") });
          } else {
            setConfirm(null);
            preview.mutate({ settings: s, force }, { onSuccess: (p) => setConfirm(p) });
          }
        }}
      >
        <SelectField label="Modularity objective" name="objective" value={s.objective} options={OBJECTIVES} onChange={(e) => setS({ ...s, objective: e.target.value as PipelineSettings["objective"] })} />
        <SelectField
          label="Null models"
          name="nullModels"
          value={nullChoiceOf(s)}
          options={NULL_CHOICES}
          onChange={(e) => setS({ ...s, nullModels: e.target.value === "standard" ? "standard" : [e.target.value as PipelineNullModelName] })}
        />
        <p className="text-sm text-stone-600 sm:col-span-2">
          Automatic objective: Barber's bipartite Q for bipartite networks, Leicht–Newman for directed food webs, Newman–Girvan otherwise. Standard null
          models: fixed degrees (curveball; the configuration model for one-mode networks) as the primary null of every network, plus probabilistic
          degrees for binary bipartite data, fixed totals and connectance for interaction counts, shuffled weights for non-integer weights, and
          Erdős–Rényi (connectance only, liberal) for comparison. A single model that does not fit some published network is refused.
        </p>
        <TextField label="Optimizer restarts" name="restarts" type="number" min={1} max={1000} required value={Number.isNaN(s.restarts) ? "" : s.restarts} onChange={num("restarts")} hint={`Default ${d.restarts}. Null replicates get the same effort.`} error={errors.restarts} />
        <TextField label="Null replicates" name="nulls" type="number" min={0} max={10000} required value={Number.isNaN(s.nulls) ? "" : s.nulls} onChange={num("nulls")} hint={`Default ${d.nulls}; 0 skips z, Q_rel and p.`} error={errors.nulls} />
        <TextField label="Seed" name="seed" type="number" min={0} required value={Number.isNaN(s.seed) ? "" : s.seed} onChange={num("seed")} hint="The same seed gives the same results on any machine." error={errors.seed} />
        <SelectField label="Simulated annealing refinement" name="annealing" value={s.annealing} options={ANNEALING} onChange={(e) => setS({ ...s, annealing: e.target.value as PipelineSettings["annealing"] })} />
        <div className="sm:col-span-2">
          <label className="inline-flex items-center gap-2 text-sm text-stone-800">
            <input type="checkbox" checked={force} onChange={(e) => setForce(e.target.checked)} className="h-4 w-4 accent-moss-700" />
            Recompute networks that already have a result for these settings
          </label>
        </div>
        <div className="flex flex-wrap gap-3 sm:col-span-2">
          <Button value="start" busy={start.isPending} disabled={batchRunning}>
            Recompute all published networks
          </Button>
          <Button value="save" variant="secondary" busy={save.isPending}>
            Save settings only
          </Button>
        </div>
        {batchRunning && <p className="text-sm text-stone-700 sm:col-span-2">A batch is running; start the next one when it has finished.</p>}
      </form>
      {confirm && (
        <div role="alertdialog" aria-labelledby="confirm-heading" className="mt-4 rounded border border-amber-300 bg-amber-50 p-4 text-sm text-stone-900">
          <h3 id="confirm-heading" className="font-semibold">
            Recompute {confirm.toCompute} of {confirm.networks} published networks?
          </h3>
          <p className="mt-1">
            The figures of <strong>{confirm.figuresChange}</strong> network{confirm.figuresChange === 1 ? "" : "s"} will change (they are shown now from
            other settings or will be recomputed); {confirm.firstFigures} will get their first figures; {confirm.skipped} already computed with these
            settings {confirm.skipped === 1 ? "is" : "are"} left out{confirm.alreadyQueued ? `; ${confirm.alreadyQueued} already waiting join the batch` : ""}.
            Figures shown now stay visible until each network's new run succeeds.
          </p>
          <div className="mt-3 flex gap-3">
            <Button
              type="button"
              busy={start.isPending}
              onClick={() =>
                start.mutate(
                  { settings: confirm.settings, force: confirm.force },
                  { onSuccess: (b) => { setConfirm(null); setNotice(`Batch #${b.id} started: ${b.total} networks queued, ${b.skipped} already up to date.`); } },
                )
              }
            >
              Yes, recompute {confirm.toCompute}
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirm(null)}>
              Cancel
            </Button>
          </div>
        </div>
      )}
      <div className="mt-4 space-y-2">
        {notice && <Alert tone="success">{notice}</Alert>}
        {save.error && <SettingsError title="The settings were not saved" error={save.error} />}
        {start.error && <SettingsError title="The batch was not started" error={start.error} />}
        {preview.error && <SettingsError title="The batch was not started" error={preview.error} />}
      </div>
    </section>
  );
}

/** A refusal with, when the server names them, the networks the settings do not fit and why. */
function SettingsError({ title, error }: { title: string; error: Error }) {
  const networks = error instanceof ApiClientError ? (error.details ?? []).filter((d) => d.path?.startsWith("/networks/")) : [];
  return (
    <Alert tone="error" title={title}>
      <p>{error.message}</p>
      {networks.length > 0 && (
        <ul className="mt-2 list-disc space-y-1 pl-5" aria-label="Networks these settings do not fit">
          {networks.map((d) => (
            <li key={d.path}>{d.message}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
