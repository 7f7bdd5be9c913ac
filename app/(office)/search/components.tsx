import type { ReactNode } from "react";

/** One kind of result; a kind with no hits is left out rather than shown empty. */
export function SearchSection({ title, testId, items }: { title: string; testId: string; items: { key: string; body: ReactNode }[] }) {
  if (!items.length) return null;
  return (
    <section className="panel space-y-2" data-testid={testId}>
      <h2 className="text-xl font-bold">{title} <span className="text-base font-normal text-ink-soft">({items.length})</span></h2>
      <ul className="space-y-2">{items.map((i) => <li key={i.key}>{i.body}</li>)}</ul>
    </section>
  );
}
