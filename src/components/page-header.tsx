import type { ReactNode } from "react";

/** How an office page opens: its title, a line on what it is for, and anything that belongs with them. */
export function PageHeader({ title, intro, wide = false, className, children }: { title: ReactNode; intro?: ReactNode; wide?: boolean; className?: string; children?: ReactNode }) {
  return (
    <header className={className}>
      <h1 className="text-3xl font-bold">{title}</h1>
      {intro ? <p className={wide ? "max-w-3xl text-ink-soft" : "text-ink-soft"}>{intro}</p> : null}
      {children}
    </header>
  );
}
