"use client";

import { useState } from "react";

/** A block of text to copy into a paper or a notebook (tikz-cd, BibTeX, JSON). */
export function CopyBlock({ text, label, maxHeight = "16rem" }: { text: string; label: string; maxHeight?: string }) {
  const [copied, setCopied] = useState(false);
  return (
    <div className="relative">
      <button
        type="button"
        className="absolute right-2 top-2 rounded border border-stone-300 bg-white px-2 py-0.5 text-xs text-stone-700 hover:bg-stone-100"
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
        className="overflow-auto rounded-md border border-stone-200 bg-stone-50 p-3 pr-16 font-mono text-xs leading-relaxed text-stone-800"
        style={{ maxHeight }}
        aria-label={label}
      >
        {text}
      </pre>
    </div>
  );
}
