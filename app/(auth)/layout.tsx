import { BrandMark } from "@/components/shell/brand-mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="mx-auto flex max-w-md flex-col px-5 py-12">
      <div className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-7 shadow-sm shadow-black/[0.04]">
        <BrandMark className="mb-5 h-9 w-9" />
        {children}
      </div>
    </div>
  );
}
