/** The Previous / Next links under a list read a page at a time; nothing when the list fits one page. */
export function Pager({ previous, next, label }: { previous: string | null; next: string | null; label: string }) {
  if (!previous && !next) return null;
  return (
    <nav aria-label={label} className="mt-3 flex justify-between gap-4 text-sm">
      {previous ? (
        <a href={previous} rel="prev">
          ← Previous
        </a>
      ) : (
        <span />
      )}
      {next ? (
        <a href={next} rel="next">
          Next →
        </a>
      ) : (
        <span />
      )}
    </nav>
  );
}
