'use client';
import { useEffect, useRef, useState } from 'react';
import clsx from 'clsx';

// A wide table's own frame: on a narrow screen the table scrolls sideways inside it and the page
// never does. The frame is a labelled region that takes keyboard focus (arrow keys scroll it),
// and while something is hidden to one side it says so twice: a shaded edge on that side and a
// line of words under it ("Scroll sideways for more columns"), so neither colour nor the
// scrollbar (hidden on phones) is the only sign. Measured on resize, so at desk width, where
// everything fits, the frame is plain.

interface Props {
  /** What the table is, for screen readers ("Members", "Items of the plan"). */
  label: string;
  children: React.ReactNode;
  className?: string;
  /** Extra classes for the scrolling box itself (e.g. a max height). */
  innerClassName?: string;
  testId?: string;
  /**
   * A line of words above the frame, for a table whose caption would otherwise be as wide as the
   * table and cut on a phone. The table keeps the same words as a caption for screen readers
   * (class "sr-only"), so this visible copy is hidden from them.
   */
  note?: React.ReactNode;
}

export function ScrollFrame({ label, children, className, innerClassName, testId, note }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const [edges, setEdges] = useState({ left: false, right: false });

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const measure = () => {
      const left = el.scrollLeft > 1;
      const right = el.scrollLeft + el.clientWidth < el.scrollWidth - 1;
      setEdges((e) => (e.left === left && e.right === right ? e : { left, right }));
    };
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    if (el.firstElementChild) ro.observe(el.firstElementChild);
    el.addEventListener('scroll', measure, { passive: true });
    return () => { ro.disconnect(); el.removeEventListener('scroll', measure); };
  }, []);

  const clipped = edges.left || edges.right;
  return (
    <div className={clsx('scroll-frame', className)} data-testid={testId}>
      {note ? <p className="hint mb-1" aria-hidden>{note}</p> : null}
      <div className="relative">
        <div
          ref={box}
          role="region"
          aria-label={label}
          tabIndex={0}
          data-clipped={clipped ? 'true' : 'false'}
          className={clsx('relative overflow-x-auto focus-visible:outline focus-visible:outline-2 focus-visible:outline-teal', innerClassName)}
        >
          {children}
        </div>
        <span aria-hidden className={clsx('scroll-edge scroll-edge-left', edges.left && 'is-on')} />
        <span aria-hidden className={clsx('scroll-edge scroll-edge-right', edges.right && 'is-on')} />
      </div>
      {clipped ? (
        <p className="scroll-hint" data-testid="scroll-hint">
          <span aria-hidden>{edges.left ? '← ' : ''}</span>Scroll sideways for more columns<span aria-hidden>{edges.right ? ' →' : ''}</span>
        </p>
      ) : null}
    </div>
  );
}
