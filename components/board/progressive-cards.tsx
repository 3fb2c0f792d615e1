"use client";

import { useEffect, useRef, useState } from "react";

/**
 * Renders a column's first cards at once and the rest as the column is scrolled (or the button pressed), so a
 * 500-card board hydrates only what is on screen. Counts in the column headers always show the full number.
 */
export function ProgressiveCards<T extends { id: string }>({
  items,
  render,
  initial = 12,
  step = 24,
}: {
  items: T[];
  render: (item: T) => React.ReactNode;
  initial?: number;
  step?: number;
}) {
  const [limit, setLimit] = useState(initial);
  const sentinel = useRef<HTMLButtonElement | null>(null);
  const more = limit < items.length;
  useEffect(() => {
    const node = sentinel.current;
    if (!node || typeof IntersectionObserver === "undefined") return;
    const observer = new IntersectionObserver((entries) => {
      if (entries.some((e) => e.isIntersecting)) setLimit((n) => n + step);
    });
    observer.observe(node);
    return () => observer.disconnect();
  }, [limit, more, step]);
  return (
    <>
      {items.slice(0, limit).map(render)}
      {more ? (
        <button
          ref={sentinel}
          type="button"
          onClick={() => setLimit((n) => n + step)}
          className="w-full rounded-md border border-dashed border-line py-2 text-xs text-muted hover:text-fg"
        >
          Showing {limit} of {items.length} · show more
        </button>
      ) : null}
    </>
  );
}
