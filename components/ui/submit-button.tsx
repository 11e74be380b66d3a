"use client";

import { useFormStatus } from "react-dom";
import { Button } from "./button";

/** A submit button that shows it is working and cannot be pressed twice. */
export function SubmitButton({ children, pendingText, className }: { children: React.ReactNode; pendingText: string; className?: string }) {
  const { pending } = useFormStatus();
  return (
    <Button type="submit" disabled={pending} aria-disabled={pending} className={className}>
      {pending ? pendingText : children}
    </Button>
  );
}
