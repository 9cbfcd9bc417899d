"use client";

import { useRouter } from "next/navigation";
import { useCallback, useEffect, useMemo, useRef, useState, useTransition } from "react";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { createSheetAction, reviewSheetAction, saveSheetAction, submitSheetAction } from "@/app/(app)/projects/[id]/sheets/actions";
import { FormAlert } from "@/components/forms/form-alert";
import { KIND_MODULES } from "@/components/sheets/forms/registry";
import { SheetFormSettingsProvider } from "@/components/sheets/forms/kit";
import { engineResolver } from "@/components/sheets/forms/resolver";
import type { KindModule } from "@/components/sheets/forms/types";
import { KindResults } from "@/components/sheets/results/kind-results";
import { ResultsPanel } from "@/components/sheets/results/results-panel";
import type { SizingCandidate } from "@/lib/engine/busbar-sizing";
import { STALE_SHEET_MESSAGE } from "@/lib/sheets/common";
import { sheetKind } from "@/lib/sheets/kinds";
import { localiseMessage, toEngineInputs, toFormValues } from "@/lib/sheets/units";
import { EDITABLE_STATUSES } from "@/lib/sheets/workflow";
import { ConflictBanner } from "./conflict-banner";
import { PickArrangement } from "./pick-arrangement";
import { safeRun } from "./safe-run";
import type { SheetEditorProps } from "./types";
import { useLiveCalc } from "./use-live-calc";
import { WorkflowBar, type WorkflowActions } from "./workflow-bar";

/**
 * The sheet editor: the kind's form on the left, live results on the right, the
 * workflow bar above. Loads the kind's form module on demand, then hands over.
 */
export function SheetEditor(props: SheetEditorProps) {
  const [mod, setMod] = useState<KindModule | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const load = KIND_MODULES[props.sheet.kind];
  const summaryOnly = props.summary !== undefined;
  useEffect(() => {
    if (!load || summaryOnly) return;
    let live = true;
    load().then(
      (m) => live && setMod(m),
      () => live && setLoadError("The form could not be loaded; check the connection and reload the page"),
    );
    return () => {
      live = false;
    };
  }, [load, summaryOnly]);
  // A network too large for the form: the page's summary in place of form and live results.
  if (summaryOnly) return <LoadedEditor {...props} mod={null} />;
  if (!load) return <FormAlert>This sheet kind ({props.sheet.kind}) has no form in this version of Ohmstead; its stored inputs and results stay in the database.</FormAlert>;
  if (loadError) return <FormAlert>{loadError}</FormAlert>;
  if (!mod)
    return (
      <div className="panel animate-pulse p-6 text-sm text-fen-500" role="status">
        Loading the form…
      </div>
    );
  return <LoadedEditor {...props} mod={mod} />;
}

type Banner = { tone: "error" | "success" | "info"; text: string; fields?: string[] } | null;

function LoadedEditor({ sheet, revision, inputs, savedResult, unitSystem, viewer, nextLabel, projectArchived, takenTags, lossSources, summary, mod }: SheetEditorProps & { mod: KindModule | null }) {
  const router = useRouter();
  const def = sheetKind(sheet.kind);
  const heavy = def?.heavy ?? false;
  const [pending, startTransition] = useTransition();
  const [conflict, setConflict] = useState(false);
  const [banner, setBanner] = useState<Banner>(null);
  const [revising, setRevising] = useState(false);
  const [title, setTitle] = useState(sheet.title);
  const [pick, setPick] = useState<SizingCandidate | null>(null);
  // The newest version this editor knows: its own writes may be ahead of the page's props until the refresh lands.
  const knownVersion = useRef(sheet.version);
  const versionNow = () => Math.max(knownVersion.current, sheet.version);
  // After a save, the stored result shown must be the new one: wait for the page to carry that version.
  const [savedVersion, setSavedVersion] = useState(sheet.version);
  const propsCurrent = sheet.version >= savedVersion;

  const isAuthor = viewer.id === revision.authorId;
  const open = revision.isLatest && !projectArchived;
  const inPlace = open && viewer.canWrite && EDITABLE_STATUSES.includes(revision.status) && isAuthor;
  const canRevise = open && viewer.canWrite && revision.status === "approved";
  const editable = inPlace || (canRevise && revising);

  const defaultValues = useMemo(() => toFormValues(sheet.kind, inputs, unitSystem), [sheet.kind, inputs, unitSystem]);
  const resolver = useMemo(() => (mod ? engineResolver(mod.schema, sheet.kind, unitSystem) : undefined), [mod, sheet.kind, unitSystem]);
  const form = useForm({ defaultValues, resolver, mode: "onChange" });
  const { control, getValues, reset, trigger, formState } = form;

  // A stored draft that does not validate shows its messages at once.
  useEffect(() => {
    if (savedResult === null) void trigger();
  }, [savedResult, trigger]);

  const values = useWatch({ control });
  const toEngine = useCallback(
    (v: Record<string, unknown>) => {
      const si = toEngineInputs(sheet.kind, v, unitSystem);
      return def?.complete ? def.complete(si) : si;
    },
    [def, sheet.kind, unitSystem],
  );
  const engineInputs = useMemo(() => toEngine(values as Record<string, unknown>), [values, toEngine]);
  const inputsJson = useMemo(() => JSON.stringify(engineInputs), [engineInputs]);
  const runHere = useMemo(() => (mod?.run ? (i: Record<string, unknown>) => safeRun(mod.schema, mod.run as (x: unknown) => never, i) : undefined), [mod]);
  const live = useLiveCalc({ kind: sheet.kind, heavy: heavy && mod !== null, inputsJson, runHere });

  const dirty = formState.isDirty || title.trim() !== sheet.title;

  const fail = useCallback((error: { code: string; message: string; fields?: Record<string, string> }) => {
    if (error.code === "conflict" && error.message === STALE_SHEET_MESSAGE) {
      setConflict(true);
      return;
    }
    const fields = Object.entries(error.fields ?? {}).map(([k, m]) => localiseMessage(sheet.kind, k, m, unitSystem));
    setBanner({ tone: "error", text: error.message, fields });
  }, [sheet.kind, unitSystem]);

  async function save(): Promise<number | null> {
    const saved = getValues();
    const res = await saveSheetAction({ sheetId: sheet.id, version: versionNow(), inputs: toEngine(saved), title: title.trim() || sheet.title });
    if (!res.ok) {
      fail(res.error);
      return null;
    }
    const d = res.data;
    knownVersion.current = d.version;
    setSavedVersion(d.version);
    // What was saved is the new reference for "unsaved changes"; the page re-reads the stored result.
    reset(saved, { keepErrors: true });
    setBanner(
      d.inputErrors
        ? { tone: "info", text: `Saved revision ${d.revision.label} as a draft. Some inputs still need attention, so there is no saved result yet.` }
        : { tone: "success", text: d.newRevision ? `Revision ${d.revision.label} started and saved; revision ${revision.label} stays as approved.` : `Saved revision ${d.revision.label}.` },
    );
    return d.version;
  }

  const act = (fn: () => Promise<void>) =>
    startTransition(async () => {
      setBanner(null);
      await fn();
    });

  const actions: WorkflowActions = {};
  if (inPlace && mod) actions.save = { label: "Save", onClick: () => act(async () => void ((await save()) !== null && router.refresh())) };
  if (canRevise && !revising && mod) actions.startRevision = { label: `Start revision ${nextLabel}`, onClick: () => setRevising(true) };
  if (canRevise && revising && mod) actions.save = { label: `Save as revision ${nextLabel}`, onClick: () => act(async () => void ((await save()) !== null && router.refresh())) };
  if (open && viewer.canSubmit && isAuthor && (revision.status === "draft" || revision.status === "returned"))
    actions.submit = () =>
      act(async () => {
        let version: number | null = versionNow();
        if (dirty) version = await save();
        if (version === null) return;
        const res = await submitSheetAction({ sheetId: sheet.id, version, transition: "submit" });
        if (!res.ok) {
          fail(res.error);
          if (dirty) router.refresh();
          return;
        }
        knownVersion.current = res.data.version;
        setBanner({ tone: "success", text: `Revision ${res.data.revision.label} submitted for review.` });
        router.refresh();
      });
  if (open && viewer.canSubmit && isAuthor && revision.status === "in_review")
    actions.withdraw = () =>
      act(async () => {
        const res = await submitSheetAction({ sheetId: sheet.id, version: versionNow(), transition: "withdraw" });
        if (!res.ok) return fail(res.error);
        knownVersion.current = res.data.version;
        router.refresh();
      });
  if (open && viewer.canReview && !isAuthor && revision.status === "in_review") {
    const decide = (transition: "approve" | "return", comment: string) =>
      act(async () => {
        const res = await reviewSheetAction({ sheetId: sheet.id, version: versionNow(), transition, comment: comment.trim() || null });
        if (!res.ok) return fail(res.error);
        knownVersion.current = res.data.version;
        setBanner({ tone: "success", text: transition === "approve" ? `Revision ${res.data.revision.label} approved.` : `Revision ${res.data.revision.label} returned to its author.` });
        router.refresh();
      });
    actions.review = { approve: (c) => decide("approve", c), return: (c) => decide("return", c) };
  }

  let note: string | undefined;
  if (projectArchived) note = "The project is archived: its sheets are read-only.";
  else if (!revision.isLatest) note = undefined;
  else if (!viewer.canWrite && !viewer.canReview) note = "You can read this sheet; your role does not change sheets.";
  else if (EDITABLE_STATUSES.includes(revision.status) && viewer.canWrite && !isAuthor)
    note = `Only the author of this revision (${revision.authorName}) can edit it.`;
  else if (revision.status === "in_review" && isAuthor) note = "In review: withdraw it to make changes.";
  else if (revision.status === "in_review" && viewer.canReview && isAuthor === false) note = undefined;
  else if (revision.status === "approved" && !revising && viewer.canWrite) note = `Approved and locked. Changing it starts revision ${nextLabel}; revision ${revision.label} stays readable.`;

  // What the results panel shows: the server's stored result unless the form has changed.
  const showLive = dirty || savedResult === null || !propsCurrent;
  const result = showLive ? (live.outcome?.ok ? live.outcome.result : null) : savedResult;
  const liveProblems = live.outcome && !live.outcome.ok ? Object.entries(live.outcome.fields).map(([k, m]) => localiseMessage(sheet.kind, k, m, unitSystem)) : [];

  return (
    <div className="space-y-4">
      {conflict ? <ConflictBanner onReload={() => window.location.reload()} /> : null}
      <WorkflowBar status={revision.status} label={revision.label} isLatest={revision.isLatest} dirty={dirty && editable} pending={pending} note={note} actions={actions} />
      {banner ? (
        <FormAlert tone={banner.tone}>
          <p>{banner.text}</p>
          {banner.fields && banner.fields.length > 0 ? (
            <ul className="mt-1 list-disc pl-5">
              {banner.fields.map((f, i) => (
                <li key={i}>{f}</li>
              ))}
            </ul>
          ) : null}
        </FormAlert>
      ) : null}
      {revision.reviewComment && revision.status === "returned" ? (
        <FormAlert tone="info">
          <p className="font-semibold">Returned by {revision.checkedByName ?? "the checker"}:</p>
          <p className="whitespace-pre-wrap">{revision.reviewComment}</p>
        </FormAlert>
      ) : null}

      {summary !== undefined || !mod ? (
        summary
      ) : (
        <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <form
            noValidate
            className="min-w-0"
            aria-label={`${def?.name ?? sheet.kind} inputs`}
            onSubmit={(e) => {
              e.preventDefault();
              actions.save?.onClick();
            }}
          >
            <fieldset disabled={!editable} className="min-w-0 space-y-4 disabled:[&_input]:bg-fen-50 disabled:[&_select]:bg-fen-50 disabled:[&_input]:text-fen-700">
              <div className="rounded-lg border border-fen-200 bg-white p-4">
                <label htmlFor="sheet-title" className="field-label">
                  Title
                </label>
                <input id="sheet-title" className="field-input" value={title} maxLength={200} onChange={(e) => setTitle(e.target.value)} />
              </div>
              <FormProvider {...form}>
                <SheetFormSettingsProvider value={{ kind: sheet.kind, unitSystem, readOnly: !editable }}>
                  <mod.Form lossSources={lossSources} />
                </SheetFormSettingsProvider>
              </FormProvider>
            </fieldset>
          </form>

          <section aria-label="Results" className="space-y-3 xl:sticky xl:top-20 xl:self-start">
            <div className="flex items-center justify-between">
              <h2 className="text-sm font-semibold uppercase tracking-wider text-fen-600">Results</h2>
              <ResultSourceBadge showLive={showLive} busy={live.busy} ms={live.ms} />
            </div>
            {showLive && liveProblems.length > 0 ? (
              <div role="status" className="rounded-md border border-fen-200 bg-white px-3 py-2 text-sm text-fen-700">
                <p className="font-semibold">No result until these inputs are fixed:</p>
                <ul className="mt-1 list-disc pl-5 text-signal-700">
                  {liveProblems.map((m, i) => (
                    <li key={i}>{m}</li>
                  ))}
                </ul>
              </div>
            ) : null}
            {result ? (
              <ResultsPanel result={result} unitSystem={unitSystem} cautioned={def?.cautioned ?? true}>
                <KindResults
                  result={result}
                  inputs={showLive ? engineInputs : inputs}
                  unitSystem={unitSystem}
                  density={live.density}
                  onPick={viewer.canWrite && !projectArchived ? (c) => setPick(c) : undefined}
                />
              </ResultsPanel>
            ) : !liveProblems.length ? (
              <p className="panel p-4 text-sm text-fen-500" role="status">
                Computing…
              </p>
            ) : null}
            {pick ? (
              <PickArrangement
                candidate={pick}
                sizingInputs={engineInputs}
                projectId={sheet.projectId}
                sizingTag={sheet.tag}
                takenTags={takenTags}
                create={createSheetAction}
                onClose={() => setPick(null)}
              />
            ) : null}
          </section>
        </div>
      )}
    </div>
  );
}

function ResultSourceBadge({ showLive, busy, ms }: { showLive: boolean; busy: boolean; ms?: number }) {
  if (!showLive)
    return (
      <span className="badge bg-verdigris-50 text-verdigris-700 ring-1 ring-inset ring-verdigris-100" data-testid="result-source" data-source="saved" title="Computed by the server when the sheet was saved">
        Saved result
      </span>
    );
  return (
    <span
      className="badge bg-copper-50 text-copper-800 ring-1 ring-inset ring-copper-200"
      data-testid="result-source"
      data-source="live"
      data-busy={busy || undefined}
      aria-live="polite"
      title="Computed in your browser as you type; saving stores the server's result"
    >
      {busy ? "Live · computing…" : `Live · not saved${ms !== undefined ? ` · ${Math.max(1, Math.round(ms))} ms` : ""}`}
    </span>
  );
}
