import type { Metadata } from "next";
import { forbidden } from "next/navigation";

export const metadata: Metadata = { title: "Not allowed" };

/** Where `requireAction` sends a refused request: app/forbidden.tsx explains it, with HTTP status 403. */
export default function ForbiddenPage(): never {
  forbidden();
}
