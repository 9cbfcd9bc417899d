"use client";

import Link from "next/link";
import { useEffect, useId, useRef, useState } from "react";

export interface UserMenuProps {
  name: string;
  email: string;
  roleLabel: string;
  organisationName: string;
}

function initials(name: string) {
  const parts = name.trim().split(/\s+/);
  return ((parts[0]?.[0] ?? "") + (parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? "") : "")).toUpperCase() || "?";
}

/** The signed-in user's name, role and organisation, with sign-out. */
export function UserMenu({ name, email, roleLabel, organisationName }: UserMenuProps) {
  const [open, setOpen] = useState(false);
  const [signingOut, setSigningOut] = useState(false);
  const menuId = useId();
  const ref = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const onPointer = (e: PointerEvent) => {
      if (ref.current && !ref.current.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") setOpen(false);
    };
    document.addEventListener("pointerdown", onPointer);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("pointerdown", onPointer);
      document.removeEventListener("keydown", onKey);
    };
  }, [open]);

  return (
    <div ref={ref} className="relative">
      <button
        type="button"
        aria-expanded={open}
        aria-controls={menuId}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-3 rounded-md px-2 py-1 text-left hover:bg-fen-800"
      >
        <span className="hidden text-right sm:block">
          <span className="block text-sm font-medium leading-tight text-white">{name}</span>
          <span className="block text-xs leading-tight text-fen-300">
            {roleLabel} · {organisationName}
          </span>
        </span>
        <span aria-hidden="true" className="flex h-8 w-8 items-center justify-center rounded-full bg-copper-600 text-xs font-semibold text-white ring-2 ring-fen-700">
          {initials(name)}
        </span>
        <span className="sr-only">Account menu</span>
      </button>
      {open && (
        <div id={menuId} className="absolute right-0 z-30 mt-2 w-64 overflow-hidden rounded-lg border border-fen-200 bg-white text-fen-900 shadow-lg">
          <div className="border-b border-fen-100 px-4 py-3">
            <p className="text-sm font-semibold">{name}</p>
            <p className="truncate text-xs text-fen-500">{email}</p>
            <p className="mt-2 text-xs text-fen-600">
              <span className="font-medium">{roleLabel}</span> at {organisationName}
            </p>
          </div>
          <Link href="/account/tokens" onClick={() => setOpen(false)} className="block px-4 py-2.5 text-sm font-medium text-fen-800 hover:bg-fen-50">
            API tokens
          </Link>
          <Link href="/api-docs" onClick={() => setOpen(false)} className="block border-b border-fen-100 px-4 py-2.5 text-sm font-medium text-fen-800 hover:bg-fen-50">
            API reference
          </Link>
          <button
            type="button"
            disabled={signingOut}
            onClick={() => {
              setSigningOut(true);
              // Loaded on demand: the sign-in library is not needed to draw any page.
              void import("next-auth/react")
                .then(({ signOut }) => signOut({ callbackUrl: "/login" }))
                .catch(() => setSigningOut(false));
            }}
            className="block w-full px-4 py-2.5 text-left text-sm font-medium text-fen-800 hover:bg-fen-50 disabled:opacity-60"
          >
            {signingOut ? "Signing out…" : "Sign out"}
          </button>
        </div>
      )}
    </div>
  );
}
