/**
 * One page of a table rendered on the server: the rows it shows, the page number kept within
 * the table (an address may ask for page 99 or "x"), and the 1-based range for "41–50 of 107".
 */
export function pageOf<T>(shown: T[], askedPage: number, pageSize: number) {
  const pages = Math.max(1, Math.ceil(shown.length / pageSize));
  const page = Math.min(Math.max(1, Math.floor(askedPage) || 1), pages);
  const from = (page - 1) * pageSize;
  return { rows: shown.slice(from, from + pageSize), page, pages, from: shown.length ? from + 1 : 0, to: Math.min(from + pageSize, shown.length), total: shown.length };
}
