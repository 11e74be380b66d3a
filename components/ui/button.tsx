import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-tide-700 text-paper-raised hover:bg-tide-800 shadow-sm",
  secondary: "bg-paper-raised text-tide-800 ring-1 ring-inset ring-line-strong hover:bg-tide-50",
  quiet: "text-tide-700 hover:bg-tide-50",
  danger: "bg-brick-600 text-paper-raised hover:bg-brick-700",
};

export function buttonClass(variant: Variant = "primary", extra = ""): string {
  return `inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${VARIANTS[variant]} ${extra}`;
}

export function Button({
  variant = "primary",
  className = "",
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button className={buttonClass(variant, className)} {...props} />;
}
