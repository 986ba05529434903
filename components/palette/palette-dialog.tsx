'use client';

// The palette's dialog (cmdk and the quick calculation): loaded on demand by ./palette.tsx, the first time
// the palette opens or the Ctrl/⌘ key goes down, so a page does not download it before the user asks.

import { Command, defaultFilter } from 'cmdk';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import type { QuickRecord } from '@/lib/sheet/types';
import { useRegistrySnapshot, type PaletteCommand } from './command-registry';
import { isRiskyCommand, needsConfirmation, riskyCommandScore } from './command-safety';
import { apiFetch } from '@/lib/api-client';
import { ConfirmCommand, LOOKS_LIKE_EXPRESSION, QuickResult, formatQuick, postQuick, useDebounced } from './quick-calculation';

const GROUP_ORDER = ['Sheet', 'Block', 'Review', 'Revisions', 'Add block', 'Go to', 'General'];

export default function PaletteDialog({
  open,
  setOpen,
  query,
  setQuery,
}: {
  open: boolean;
  setOpen: (open: boolean) => void;
  query: string;
  setQuery: (query: string) => void;
}) {
  const { commands, quickInsert } = useRegistrySnapshot();
  const queryClient = useQueryClient();
  const trimmed = query.trim();
  const debounced = useDebounced(trimmed, 250);
  const isExpression = LOOKS_LIKE_EXPRESSION.test(debounced) && debounced.length <= 2000;
  const [notice, setNotice] = useState<string | null>(null);

  const quick = useQuery({
    queryKey: ['quick-preview', debounced],
    queryFn: () => postQuick(debounced, true),
    enabled: open && isExpression,
    retry: false,
    staleTime: 60_000,
  });
  const recent = useQuery({
    queryKey: ['quick-recent'],
    queryFn: () =>
      apiFetch<{ items: QuickRecord[] }>('/api/quick/recent').catch(() => {
        throw new Error('Could not load recent quick calculations.');
      }),
    enabled: open,
    staleTime: 5_000,
  });


  const groups = useMemo(() => {
    const byGroup = new Map<string, PaletteCommand[]>();
    for (const command of commands) {
      const list = byGroup.get(command.group) ?? [];
      list.push(command);
      byGroup.set(command.group, list);
    }
    return [...byGroup.entries()].sort((a, b) => {
      const ia = GROUP_ORDER.indexOf(a[0]);
      const ib = GROUP_ORDER.indexOf(b[0]);
      return (ia < 0 ? 99 : ia) - (ib < 0 ? 99 : ib);
    });
  }, [commands]);

  // A destructive command waits here for an explicit confirmation.
  const [pending, setPending] = useState<PaletteCommand | null>(null);

  // Closing the palette forgets its notice and any command waiting for confirmation (set while rendering
  // when `open` changes, as React advises for state that follows a prop, not in an effect).
  const [wasOpen, setWasOpen] = useState(open);
  if (open !== wasOpen) {
    setWasOpen(open);
    if (!open) {
      setNotice(null);
      setPending(null);
    }
  }

  const runCommand = (command: PaletteCommand) => {
    if (needsConfirmation(command.id) && pending?.id !== command.id) {
      setPending(command);
      return;
    }
    setPending(null);
    setOpen(false);
    // Let the dialog close before the command moves focus.
    setTimeout(() => command.run(), 0);
  };

  const acceptQuick = async () => {
    const expr = trimmed;
    if (!expr) return;
    try {
      const answer = await postQuick(expr, false);
      void queryClient.invalidateQueries({ queryKey: ['quick-recent'] });
      if (quickInsert) {
        setOpen(false);
        setTimeout(() => quickInsert(expr), 0);
      } else {
        setNotice(`Kept in your recent quick calculations: ${expr} = ${formatQuick(answer)}. Open a sheet you can edit to insert it as a block.`);
      }
    } catch (error) {
      setNotice(error instanceof Error ? error.message : 'The quick calculation failed.');
    }
  };

  const showQuick = LOOKS_LIKE_EXPRESSION.test(trimmed) && trimmed.length <= 2000;
  const quickIsCurrent = trimmed === debounced;
  // While an expression is typed, Enter takes the quick result.
  // Set while rendering whenever the typed text changes, as for `open` above.
  const [selected, setSelected] = useState(showQuick ? '__quick' : '');
  const [selectedFor, setSelectedFor] = useState(trimmed);
  if (trimmed !== selectedFor) {
    setSelectedFor(trimmed);
    if (showQuick) setSelected('__quick');
  }
  const riskyTitles = useMemo(() => {
    const titles = new Map<string, string>();
    for (const command of commands) if (isRiskyCommand(command.id)) titles.set(commandValue(command), command.title);
    return titles;
  }, [commands]);
  const filter = (value: string, search: string, keywords?: string[]) => {
    if (value === '__quick') return 1;
    const score = defaultScore(value, search, keywords);
    const riskyTitle = riskyTitles.get(value);
    return riskyTitle === undefined ? score : riskyCommandScore(riskyTitle, search, score);
  };

  return (
    <Command.Dialog
      open={open}
      onOpenChange={setOpen}
      label="Command palette"
      filter={filter}
      value={selected}
      onValueChange={setSelected}
      loop
      overlayClassName="fixed inset-0 z-40 bg-basalt/30"
      contentClassName="fixed left-1/2 top-[12vh] z-50 w-[min(640px,calc(100vw-24px))] -translate-x-1/2 overflow-hidden rounded-[6px] border border-rule bg-chalk text-basalt shadow-2xl"
    >
      <div className="flex items-center gap-2 border-b border-rule px-3">
        <span aria-hidden="true" className="text-slate">›</span>
        <Command.Input
          value={query}
          onValueChange={setQuery}
          aria-label="Search commands, or type an expression for a quick calculation"
          placeholder="Search commands, or type an expression such as 2 m / 3 s"
          className="h-11 w-full bg-transparent text-[14px] outline-none placeholder:text-slate"
        />
      </div>
      <Command.List className="max-h-[min(60vh,480px)] overflow-y-auto p-1.5" aria-label="Commands">
        {showQuick ? (
          <QuickResult quick={quick} current={quickIsCurrent} canInsert={quickInsert !== null} onAccept={acceptQuick} />
        ) : null}
        {notice ? (
          <p role="status" className="px-2 py-1.5 text-[12px] text-slate">
            {notice}
          </p>
        ) : null}
        {pending ? (
          <ConfirmCommand command={pending} onConfirm={() => runCommand(pending)} onCancel={() => setPending(null)} />
        ) : null}
        <Command.Empty className="px-2 py-3 text-[13px] text-slate">No command matches. Type a number or a bracket to calculate.</Command.Empty>
        {groups.map(([group, list]) => (
          <Command.Group key={group} heading={group} className="palette-group">
            {list.map((command) => (
              <Command.Item
                key={command.id}
                value={commandValue(command)}
                keywords={command.keywords}
                onSelect={() => runCommand(command)}
                className="palette-item"
              >
                <span className="flex min-w-0 flex-1 flex-col">
                  <span className="truncate">{command.title}</span>
                  {command.detail ? <span className="truncate text-[12px] text-slate">{command.detail}</span> : null}
                </span>
                {command.shortcut ? <kbd className="palette-kbd">{command.shortcut}</kbd> : null}
              </Command.Item>
            ))}
          </Command.Group>
        ))}
        {!trimmed && recent.data && recent.data.items.length > 0 ? (
          <Command.Group heading="Recent quick calculations" className="palette-group">
            {recent.data.items.slice(0, 8).map((item) => (
              <Command.Item key={item.id} value={`recent ${item.id} ${item.expression}`} onSelect={() => setQuery(item.expression)} className="palette-item">
                <span className="num min-w-0 flex-1 truncate">{item.expression}</span>
                <span className="num text-slate">= {formatQuick(item.result)}</span>
              </Command.Item>
            ))}
          </Command.Group>
        ) : null}
      </Command.List>
    </Command.Dialog>
  );
}

/** The text cmdk matches and scores an entry by. */
function commandValue(command: PaletteCommand): string {
  return `${command.group}: ${command.title} ${command.id}`;
}

// cmdk's own scoring, kept for every entry but the quick result.
function defaultScore(value: string, search: string, keywords?: string[]): number {
  return defaultFilter(value, search, keywords);
}
