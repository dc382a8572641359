/**
 * The guided deposit: 1 study metadata → 2 networks (upload, preview, per-network metadata) → 3 review and
 * submit. Drafts save as you go (each step's Save), can be left and resumed from My deposits. A change
 * request shows the conversation with the curators on top (their comments, the depositor's replies); the
 * depositor edits and submits again, with a reply if they like.
 */
import { useEffect, useState } from "react";
import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { ApiClientError } from "../../../lib/api-client";
import { paths } from "../../../config/paths";
import { StudyForm, type StudyDraft } from "../../../components/metadata/study-form";
import { prune, studyErrors, visibleErrors } from "../../../components/metadata/validate";
import { Alert, Button } from "../../../components/ui/form";
import { useDeposit } from "../api/get-deposit";
import { createDeposit, reorderNetworks, submitDeposit, updateStudyMetadata, useDepositMutation } from "../api/mutations";
import { STATE_LABELS, type DepositDetail } from "../api/types";
import { NetworkCard } from "./network-card";
import { UploadPanel } from "./upload-panel";
import { MetadataSheetPanel } from "./metadata-sheet-panel";
import { SubmissionThread } from "../../../components/thread/submission-thread";
import { useDepositThread, usePostDepositComment } from "../api/thread";

const STEPS = ["Study", "Networks", "Review and submit"] as const;

function Steps({ step, onStep, enabled }: { step: number; onStep: (s: number) => void; enabled: boolean }) {
  return (
    <nav aria-label="Deposit steps" className="mt-4">
      <ol className="flex flex-wrap gap-2">
        {STEPS.map((s, i) => (
          <li key={s}>
            <button
              type="button"
              disabled={!enabled && i > 0}
              aria-current={step === i + 1 ? "step" : undefined}
              onClick={() => onStep(i + 1)}
              className={`rounded-full px-4 py-1.5 text-sm font-semibold ring-1 ${step === i + 1 ? "bg-moss-700 text-white ring-moss-700" : "bg-white text-moss-700 ring-moss-700 hover:bg-moss-50"} disabled:opacity-50`}
            >
              {i + 1}. {s}
            </button>
          </li>
        ))}
      </ol>
    </nav>
  );
}

function StudyStep({ deposit, onSaved }: { deposit: DepositDetail | null; onSaved: (d: DepositDetail) => void }) {
  const [draft, setDraft] = useState<StudyDraft>(() => (deposit?.metadata as StudyDraft) ?? { creators: [{}] });
  const [showAll, setShowAll] = useState(false);
  const editable = deposit ? deposit.editable : true;
  const save = useDepositMutation((meta: unknown) => (deposit ? updateStudyMetadata(deposit.versionId, meta) : createDeposit(meta)));
  const errors = visibleErrors(studyErrors(draft), draft, showAll);
  return (
    <form
      aria-labelledby="study-heading"
      className="mt-6 rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200"
      onSubmit={(e) => {
        e.preventDefault();
        setShowAll(true);
        save.mutate(prune(draft), { onSuccess: (d) => d && "versionId" in d && onSaved(d) });
      }}
    >
      <h2 id="study-heading" className="text-xl font-bold text-moss-700">
        1. Study
      </h2>
      <p className="mt-1 text-sm text-stone-700">You may save an incomplete draft and come back later; everything is checked when you submit.</p>
      <div className="mt-4">
        <StudyForm value={draft} onChange={setDraft} errors={errors} disabled={!editable} />
      </div>
      {save.error && <div className="mt-4"><Alert tone="error" title={save.error.message} /></div>}
      {editable && (
        <div className="mt-6 flex gap-3">
          <Button busy={save.isPending}>{deposit ? "Save and continue" : "Save draft and continue"}</Button>
        </div>
      )}
    </form>
  );
}

function NetworksStep({ deposit, showAll, onNext }: { deposit: DepositDetail; showAll: boolean; onNext: () => void }) {
  const reorder = useDepositMutation((order: number[]) => reorderNetworks(deposit.versionId, order));
  const ids = deposit.networks.map((n) => n.id);
  const move = (i: number, dir: -1 | 1) => {
    const next = [...ids];
    [next[i], next[i + dir]] = [next[i + dir], next[i]];
    reorder.mutate(next);
  };
  return (
    <section aria-labelledby="networks-heading" className="mt-6 grid gap-4">
      <h2 id="networks-heading" className="text-xl font-bold text-moss-700">
        2. Networks
      </h2>
      {deposit.editable && <UploadPanel versionId={deposit.versionId} />}
      {deposit.networks.length > 0 && <MetadataSheetPanel deposit={deposit} />}
      {deposit.networks.length === 0 ? (
        <p className="text-stone-700">No network yet.</p>
      ) : (
        <ol className="grid gap-4" aria-label="Networks of this deposit">
          {deposit.networks.map((n, i) => (
            <NetworkCard key={n.id} deposit={deposit} n={n} count={deposit.networks.length} editable={deposit.editable} showAll={showAll} onMove={(dir) => move(i, dir)} />
          ))}
        </ol>
      )}
      <div>
        <Button type="button" variant="secondary" onClick={onNext} disabled={!deposit.networks.length}>
          Continue to review
        </Button>
      </div>
    </section>
  );
}

function DepositThread({ versionId }: { versionId: number }) {
  const { data, error } = useDepositThread(versionId);
  const post = usePostDepositComment(versionId);
  if (error) return <div className="mt-6"><Alert tone="error" title={`The conversation could not be loaded: ${error.message}`} /></div>;
  if (!data) return null;
  return (
    <div className="mt-6">
      <SubmissionThread entries={data.entries} side={data.side} canComment={data.canComment} onSend={(b) => post.mutateAsync(b)} sending={post.isPending} error={post.error?.message ?? null} />
    </div>
  );
}

function ReviewStep({ deposit }: { deposit: DepositDetail }) {
  const [reply, setReply] = useState("");
  const submit = useDepositMutation(() => submitDeposit(deposit.versionId, reply));
  const again = deposit.version.state === "changes_requested";
  const err = submit.error instanceof ApiClientError ? submit.error : null;
  const studyProblems = deposit.findings.study;
  const netProblems = deposit.findings.networks.filter((n) => n.findings.length);
  const ready = !studyProblems.length && !netProblems.length && deposit.networks.length > 0;
  return (
    <section aria-labelledby="review-heading" className="mt-6 rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
      <h2 id="review-heading" className="text-xl font-bold text-moss-700">
        3. Review and submit
      </h2>
      <dl className="mt-4 grid gap-x-6 gap-y-2 text-sm md:grid-cols-[max-content_1fr]">
        <dt className="font-semibold">Title</dt>
        <dd>{deposit.metadata.title || "—"}</dd>
        <dt className="font-semibold">Creators</dt>
        <dd>{(deposit.metadata.creators ?? []).map((c) => c.name).filter(Boolean).join("; ") || "—"}</dd>
        <dt className="font-semibold">Licence</dt>
        <dd>{deposit.metadata.licence ?? "—"}</dd>
        <dt className="font-semibold">Networks</dt>
        <dd>{deposit.networks.map((n) => `${n.position}. ${n.metadata.name ?? n.originalName} (${n.nLinks} links)`).join("; ") || "none"}</dd>
      </dl>
      {submit.isSuccess ? (
        <div className="mt-4"><Alert tone="success" title="Submitted for review.">The curators were told by e-mail; you will get an e-mail with their decision.</Alert></div>
      ) : ready ? (
        <div className="mt-4"><Alert tone="success" title="Everything required is filled in.">A curator will review the deposit; you will get an e-mail with their decision.</Alert></div>
      ) : (
        <div className="mt-4">
          <Alert tone="info" title="Still to do before submitting">
            <ul className="list-disc pl-5">
              {deposit.networks.length === 0 && <li>Add at least one network file.</li>}
              {studyProblems.map((f) => (
                <li key={f.path}>Study: {f.message}</li>
              ))}
              {netProblems.flatMap((n) => n.findings.map((f) => <li key={`${n.networkId}${f.path}`}>Network {n.position}: {f.message}</li>))}
            </ul>
          </Alert>
        </div>
      )}
      {err && (
        <div className="mt-4">
          <Alert tone="error" title={err.message}>
            {err.details && (
              <ul className="list-disc pl-5">
                {err.details.map((d, i) => (
                  <li key={i}>{d.message}</li>
                ))}
              </ul>
            )}
          </Alert>
        </div>
      )}
      {deposit.editable && (
        <div className="mt-6">
          <label htmlFor="submit-reply" className="block text-sm font-semibold text-stone-800">
            {again ? "Your reply to the curators (optional)" : "A note to the curators (optional)"}
          </label>
          <p id="submit-reply-hint" className="text-sm text-stone-600">
            {again ? "Say what you changed, or why something stays as it is. It joins the conversation below and is quoted in the curators’ e-mail." : "Anything the curators should know. It starts the conversation with them."}
          </p>
          <textarea id="submit-reply" aria-describedby="submit-reply-hint" rows={3} maxLength={10000} value={reply} onChange={(e) => setReply(e.target.value)} className="mt-1 block w-full rounded border border-stone-400 px-3 py-2 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200" />
          <div className="mt-3">
            <Button type="button" busy={submit.isPending} onClick={() => submit.mutate(undefined, { onSuccess: () => setReply("") })}>
              {again ? "Submit again for review" : "Submit for review"}
            </Button>
          </div>
        </div>
      )}
    </section>
  );
}

export function DepositFlow({ versionId }: { versionId: number | null }) {
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const step = Math.min(3, Math.max(1, Number(params.get("step") ?? 1) || 1));
  const setStep = (s: number) => setParams((p) => { p.set("step", String(s)); return p; });
  const { data: deposit, error, isPending } = useDeposit(versionId);
  const [showAll, setShowAll] = useState(false);
  useEffect(() => { if (step === 3) setShowAll(true); }, [step]);

  if (versionId !== null && isPending) return <p role="status">Loading the deposit…</p>;
  if (error) return <Alert tone="error" title={error instanceof ApiClientError && error.status === 404 ? "No such deposit, or it is not yours." : error.message} />;
  const d = deposit ?? null;
  const lastReview = d?.reviews[d.reviews.length - 1];
  return (
    <div>
      <h1 className="text-2xl font-bold text-moss-700">{d ? `Deposit: ${d.metadata.title || "untitled draft"}` : "New deposit"}</h1>
      {d && (
        <p className="mt-1 text-sm text-stone-700">
          Version {d.version.number}
          {d.accession ? ` of ${d.accession}` : ""} · <strong>{STATE_LABELS[d.version.state]}</strong> · <Link className="text-moss-700 underline" to={paths.myDeposits.href()}>My deposits</Link>
        </p>
      )}
      {d?.version.state === "changes_requested" && lastReview?.comment && (
        <div className="mt-4">
          <Alert tone="info" title={`${lastReview.curator} asks for changes`}>
            <p className="text-sm">Their comments are in the conversation below. Edit the deposit, then submit it again from step 3 (you can reply there, or write to the curators now).</p>
          </Alert>
        </div>
      )}
      {d && d.version.state !== "draft" && <DepositThread versionId={d.versionId} />}
      {d && !d.editable && (
        <div className="mt-4">
          <Alert tone="info" title={`This version is ${STATE_LABELS[d.version.state].toLowerCase()}.`}>It cannot be edited now.</Alert>
        </div>
      )}
      <Steps step={d ? step : 1} onStep={setStep} enabled={!!d} />
      {(!d || step === 1) && (
        <StudyStep
          key={d?.versionId ?? "new"}
          deposit={d}
          onSaved={(saved) => {
            if (!d) navigate(`${paths.depositResume.href(saved.versionId)}?step=2`);
            else setStep(2);
          }}
        />
      )}
      {d && step === 2 && <NetworksStep deposit={d} showAll={showAll} onNext={() => setStep(3)} />}
      {d && step === 3 && <ReviewStep deposit={d} />}
    </div>
  );
}
