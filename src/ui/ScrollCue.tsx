import { useEffect, useRef, useState, type ReactNode } from 'react';

// A box that scrolls sideways when its content is wider, with a visible cue
// while there is more to see: a shaded edge on the hidden side and a line
// saying so, gone once the user has scrolled to the end.

/** Which sides have content hidden beyond them (1 px of slack for rounding). */
export function hiddenSides(scrollLeft: number, clientWidth: number, scrollWidth: number): { left: boolean; right: boolean } {
  return { left: scrollLeft > 1, right: scrollLeft + clientWidth < scrollWidth - 1 };
}

export function ScrollCue({ children, labelledBy, testId }: { children: ReactNode; labelledBy?: string; testId?: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const [sides, setSides] = useState({ left: false, right: false });
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const update = () => {
      const s = hiddenSides(el.scrollLeft, el.clientWidth, el.scrollWidth);
      setSides((p) => (p.left === s.left && p.right === s.right ? p : s));
    };
    update();
    el.addEventListener('scroll', update, { passive: true });
    const ro = new ResizeObserver(update);
    ro.observe(el);
    if (el.firstElementChild) ro.observe(el.firstElementChild);
    return () => { el.removeEventListener('scroll', update); ro.disconnect(); };
  }, []);
  const cls = `scroll-cue${sides.left ? ' more-left' : ''}${sides.right ? ' more-right' : ''}`;
  return (
    <div className={cls} data-testid={testId} data-more-right={sides.right ? '1' : '0'}>
      <div className="table-wrap" ref={ref} tabIndex={0} role="region" aria-labelledby={labelledBy}>
        {children}
      </div>
      {(sides.right || sides.left) && (
        <p className="scroll-hint" data-testid={testId ? `${testId}-hint` : undefined}>
          {sides.right ? 'More columns to the right: swipe or scroll sideways →' : '← More columns to the left'}
        </p>
      )}
    </div>
  );
}
