"use client";

import { useState } from "react";

/** A block of text to copy into a paper or a notebook (tikz-cd, BibTeX, JSON). */
export function CopyBlock({ text, label, maxHeight = "16rem", wrap = false }: { text: string; label: string; maxHeight?: string; wrap?: boolean }) {
  const [copied, setCopied] = useState(false);
  return (
    <div className="relative min-w-0">
      <button
        type="button"
        className="absolute right-2 top-2 rounded border border-line-strong bg-paper-raised px-2 py-0.5 text-xs text-ink-soft hover:bg-tide-50"
        aria-label={`Copy ${label}`}
        onClick={async () => {
          await navigator.clipboard.writeText(text);
          setCopied(true);
          setTimeout(() => setCopied(false), 1500);
        }}
      >
        {copied ? "Copied" : "Copy"}
      </button>
      <pre
        className={`overflow-auto rounded-md ${wrap ? "whitespace-pre-wrap break-all" : ""} border border-line bg-paper p-3 pr-16 font-mono text-xs leading-relaxed text-ink-soft`}
        style={{ maxHeight }}
        aria-label={label}
      >
        {text}
      </pre>
    </div>
  );
}
