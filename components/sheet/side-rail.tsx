'use client';

import { Button } from '@/components/ui/button';
import { useId, useState, type ReactNode } from 'react';

/** One tab of the side rail. Adding a panel is one more entry in the list the page passes. */
export interface RailPanel {
  id: string;
  title: string;
  render: () => ReactNode;
}

/** The side rail for the selected block: tabs over a list of panels; collapsible on narrow screens. */
export function SideRail({
  panels,
  label = 'Selected block',
  active: controlled,
  onActiveChange,
}: {
  panels: RailPanel[];
  label?: string;
  /** The open tab, when the page controls it (e.g. a palette command opens the comments). */
  active?: string;
  onActiveChange?: (id: string) => void;
}) {
  const [own, setOwn] = useState(panels[0]?.id ?? '');
  const active = controlled ?? own;
  const setActive = (id: string) => {
    setOwn(id);
    onActiveChange?.(id);
  };
  const [openOnNarrow, setOpenOnNarrow] = useState(false);
  const base = useId();
  const current = panels.find((p) => p.id === active) ?? panels[0];
  const onKey = (event: React.KeyboardEvent, index: number) => {
    if (event.key !== 'ArrowRight' && event.key !== 'ArrowLeft') return;
    event.preventDefault();
    const next = panels[(index + (event.key === 'ArrowRight' ? 1 : panels.length - 1)) % panels.length]!;
    setActive(next.id);
    document.getElementById(`${base}-tab-${next.id}`)?.focus();
  };
  return (
    <aside aria-label={label} data-side-rail="" className="lg:sticky lg:top-16 lg:max-h-[calc(100vh-5rem)] lg:overflow-y-auto">
      {/* On a phone or tablet the rail is a drawer, opened from a button that stays in reach of the thumb. */}
      <Button
        variant="quiet"
        size="bare"
        data-rail-toggle=""
        className="fixed bottom-3 right-3 z-30 h-10 rounded-full px-4 text-[13px] font-medium shadow-lg lg:hidden"
        aria-expanded={openOnNarrow}
        onClick={() => setOpenOnNarrow((v) => !v)}
      >
        {openOnNarrow ? 'Close' : panels.map((p) => p.title).join(' · ')}
      </Button>
      <div
        className={`${openOnNarrow ? 'fixed inset-x-0 bottom-0 z-20 block max-h-[75vh] overflow-y-auto pb-16 shadow-2xl' : 'hidden'} rounded-[4px] border border-rule bg-chalk lg:static lg:block lg:max-h-none lg:overflow-visible lg:pb-0 lg:shadow-none`}
      >
        <div role="tablist" aria-label={label} className="flex border-b border-rule px-2">
          {panels.map((panel, index) => (
            // A tab of the tablist, not an action: its look and arrow keys are the tablist's own.
            <button
              key={panel.id}
              id={`${base}-tab-${panel.id}`}
              role="tab"
              type="button"
              aria-selected={panel.id === current?.id}
              aria-controls={`${base}-panel-${panel.id}`}
              tabIndex={panel.id === current?.id ? 0 : -1}
              onClick={() => setActive(panel.id)}
              onKeyDown={(e) => onKey(e, index)}
              className={`-mb-px h-9 border-b-2 px-3 text-[13px] ${panel.id === current?.id ? 'border-river font-semibold text-basalt' : 'border-transparent text-slate hover:text-basalt'}`}
            >
              {panel.title}
            </button>
          ))}
        </div>
        {current ? (
          <div role="tabpanel" id={`${base}-panel-${current.id}`} aria-labelledby={`${base}-tab-${current.id}`} className="p-3" tabIndex={0}>
            {current.render()}
          </div>
        ) : null}
      </div>
    </aside>
  );
}
