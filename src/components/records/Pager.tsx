import type { ReactNode } from 'react';

/** The footer under a paged table: a summary on the left, previous / page x of y / next on the right. */
export default function Pager({ summary, page, pages, setPage }: { summary: ReactNode; page: number; pages: number; setPage: (page: number) => void }) {
  return (
    <div className="flex items-center justify-between border-t border-slateblue-100 px-3 py-2 text-xs text-slateblue-600">
      {summary}
      <div className="flex items-center gap-2">
        <button type="button" className="btn-quiet px-2 py-1" disabled={page <= 1} onClick={() => setPage(page - 1)}>Previous</button>
        <span className="figure">Page {page} of {pages}</span>
        <button type="button" className="btn-quiet px-2 py-1" disabled={page >= pages} onClick={() => setPage(page + 1)}>Next</button>
      </div>
    </div>
  );
}
