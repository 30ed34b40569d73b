import { useEffect, useRef, useState } from 'react';
import type { RecentEntry } from '../state/recent';
import { recentTimeLabel } from '../state/recent';
import { bodyLabel } from '../caption';

// The header's "Recent" list: the scenarios set aside when a link, an import
// or another recent scenario replaced them. Choosing one opens it (and sets
// the current one aside in turn).

export function RecentMenu({ entries, onOpen }: { entries: RecentEntry[]; onOpen: (e: RecentEntry) => void }) {
  const [open, setOpen] = useState(false);
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const close = (ev: MouseEvent | KeyboardEvent) => {
      if (ev instanceof KeyboardEvent ? ev.key === 'Escape' : !box.current?.contains(ev.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', close);
    document.addEventListener('keydown', close);
    return () => { document.removeEventListener('mousedown', close); document.removeEventListener('keydown', close); };
  }, [open]);
  return (
    <div className="recent" ref={box}>
      <button type="button" aria-expanded={open} aria-controls="recent-list" onClick={() => setOpen((o) => !o)}
        title="Scenarios set aside when a link, an import or another recent scenario replaced them (kept in this browser)">
        Recent ({entries.length}) ▾
      </button>
      {open && (
        <div className="recent-pop" id="recent-list" role="region" aria-label="Recent scenarios">
          {entries.length === 0 ? (
            <p className="recent-empty">No earlier scenarios yet. When a link or an import replaces your scenario, it is kept here (the last ten).</p>
          ) : (
            <ul>
              {entries.map((e, i) => (
                <li key={`${e.saved_at}-${i}`}>
                  <button type="button" onClick={() => { setOpen(false); onOpen(e); }}>
                    <span className="recent-name">{e.name || 'Untitled scenario'}</span>
                    <span className="recent-meta">{bodyLabel(e.scenario.site.body)} · set aside {recentTimeLabel(e.saved_at)}</span>
                  </button>
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </div>
  );
}
