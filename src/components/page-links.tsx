import Link from "@/components/app-link";

type Props = { page: number; pages: number; href: (page: number) => string; label: string; testId?: string; words: { previous: string; next: string; pageOf: string } };

/** Previous and next links under a table rendered on the server a page at a time (the page is in the address); nothing for one page. */
export function PageLinks({ page, pages, href, label, testId, words }: Props) {
  if (pages <= 1) return null;
  return (
    <nav className="flex items-center gap-3 text-sm" aria-label={label} data-testid={testId}>
      {page > 1 ? <Link href={href(page - 1)} className="btn-quiet" rel="prev">{words.previous}</Link> : null}
      <span>{words.pageOf}</span>
      {page < pages ? <Link href={href(page + 1)} className="btn-quiet" rel="next">{words.next}</Link> : null}
    </nav>
  );
}
