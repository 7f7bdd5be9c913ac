import { BrandMark } from "@/components/brand-mark";

/** Pages anyone may open from a bottle's QR code: no sign-in, phone first, printable. */
export default function PublicLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="min-h-dvh bg-paper">
      <main className="mx-auto max-w-xl px-4 py-6 print:max-w-none">{children}</main>
      <footer className="mx-auto flex max-w-xl items-center gap-2 px-4 pb-8 text-xs text-ink-soft">
        <BrandMark className="h-5 w-5" /> Grainline
      </footer>
    </div>
  );
}
