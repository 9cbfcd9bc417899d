"use client";

import { useId, useState } from "react";
import type { SheetStatus } from "@/db/schema/sheets";
import { SheetStatusBadge } from "./status";

export interface WorkflowActions {
  save?: { label: string; onClick: () => void };
  startRevision?: { label: string; onClick: () => void };
  submit?: () => void;
  withdraw?: () => void;
  /** Lead, not the author, revision in review. */
  review?: { approve: (comment: string) => void; return: (comment: string) => void };
}

/**
 * The sheet's status, revision and the actions this user may take now. Each action is
 * offered only when the workflow allows it for this user; the server decides again.
 */
export function WorkflowBar({
  status,
  label,
  isLatest,
  dirty,
  pending,
  note,
  actions,
}: {
  status: SheetStatus;
  label: string;
  isLatest: boolean;
  dirty: boolean;
  pending: boolean;
  note?: string;
  actions: WorkflowActions;
}) {
  const [reviewing, setReviewing] = useState(false);
  const [comment, setComment] = useState("");
  const [commentError, setCommentError] = useState<string | null>(null);
  const commentId = useId();
  return (
    <div className="panel space-y-3 px-4 py-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-3 text-sm">
          <span className="font-mono text-base font-semibold text-fen-900" data-testid="revision-label">
            Rev {label}
          </span>
          <SheetStatusBadge status={status} />
          {!isLatest ? <span className="text-fen-500">An earlier revision, kept read-only</span> : null}
          {dirty ? <span className="text-amberline-700">Unsaved changes</span> : null}
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {actions.startRevision ? (
            <button type="button" className="btn-primary" disabled={pending} onClick={actions.startRevision.onClick}>
              {actions.startRevision.label}
            </button>
          ) : null}
          {actions.save ? (
            <button type="button" className="btn-primary" disabled={pending} onClick={actions.save.onClick}>
              {actions.save.label}
            </button>
          ) : null}
          {actions.submit ? (
            <button type="button" className="btn-secondary" disabled={pending} onClick={actions.submit}>
              {dirty ? "Save and submit for review" : "Submit for review"}
            </button>
          ) : null}
          {actions.withdraw ? (
            <button type="button" className="btn-secondary" disabled={pending} onClick={actions.withdraw}>
              Withdraw from review
            </button>
          ) : null}
          {actions.review && !reviewing ? (
            <button type="button" className="btn-primary" disabled={pending} onClick={() => setReviewing(true)}>
              Check this revision
            </button>
          ) : null}
        </div>
      </div>
      {note ? <p className="text-sm text-fen-600">{note}</p> : null}
      {actions.review && reviewing ? (
        <div className="rounded-md border border-fen-200 bg-fen-50 p-3">
          <label htmlFor={commentId} className="field-label">
            Review comment <span className="font-normal text-fen-500">(required to return; optional to approve)</span>
          </label>
          <textarea
            id={commentId}
            className="field-input min-h-20"
            value={comment}
            maxLength={4000}
            aria-invalid={commentError ? true : undefined}
            aria-describedby={commentError ? `${commentId}-error` : undefined}
            onChange={(e) => {
              setComment(e.target.value);
              if (commentError && e.target.value.trim()) setCommentError(null);
            }}
          />
          {commentError ? (
            <p id={`${commentId}-error`} className="field-error">
              {commentError}
            </p>
          ) : null}
          <div className="mt-3 flex flex-wrap gap-2">
            <button type="button" className="btn-primary" disabled={pending} onClick={() => actions.review!.approve(comment)}>
              Approve revision {label}
            </button>
            <button
              type="button"
              className="btn-danger"
              disabled={pending}
              onClick={() => {
                if (!comment.trim()) {
                  setCommentError("Say what needs changing: a comment is required to return a sheet");
                  return;
                }
                actions.review!.return(comment);
              }}
            >
              Return with comment
            </button>
            <button type="button" className="btn-secondary" disabled={pending} onClick={() => setReviewing(false)}>
              Cancel
            </button>
          </div>
        </div>
      ) : null}
    </div>
  );
}
