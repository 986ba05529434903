'use client';

import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { BlockCard, type BlockCardActions } from '@/components/blocks/block-card';
import type { CompletionData } from '@/components/blocks/expression-language';
import { useQuickInsert, useRegisterCommands, useCommandRegistry, type PaletteCommand } from '@/components/palette/command-registry';
import { isTypingTarget } from '@/components/palette/shortcuts';
import type { SheetStatus } from '@/components/ui/status';
import {
  addParameter,
  createBlock,
  duplicateBlock,
  insertBlock,
  moveBlock,
  precheckBlockName,
  removeBlock,
  removeParameter,
  renameBlock,
  renameParameter,
  setDisplayUnit,
  setInput,
  setNote,
} from '@/lib/sheet/document-edits';
import type { BlockCatalogData, BlockResult, CatalogType, SheetDocument } from '@/lib/sheet/types';
import type { BlockState } from './block-status';
import { HelpPanel } from './help-panel';
import { SheetHeader } from './sheet-header';
import { SideRail, type RailPanel } from './side-rail';
import { useSheetDraft, type SaveState } from './use-sheet-draft';

export interface SheetWorkspaceProps {
  sheetId: string;
  draft: { version: number; document: SheetDocument };
  head: { number: number; hash: string; status: SheetStatus } | null;
  catalog: BlockCatalogData;
  canEdit: boolean;
  role: string;
  otherSheets: { id: string; title: string }[];
  /** Extra rail panels (comments, history...) added by later features. */
  extraPanels?: RailPanel[];
}

function SaveIndicator({ state, evaluating, evaluateError }: { state: SaveState; evaluating: boolean; evaluateError: string | null }) {
  const text =
    state.kind === 'read-only'
      ? 'Read-only for your role'
      : state.kind === 'saved'
        ? 'All edits saved'
        : state.kind === 'pending'
          ? 'Edits not yet saved'
          : state.kind === 'saving'
            ? 'Saving…'
            : state.kind === 'retrying'
              ? `Save failed (${state.message}); retrying in ${state.inSeconds} s`
              : state.kind === 'invalid'
                ? `Not saved: ${state.message}`
                : 'Not saved: someone else saved first';
  const tone = state.kind === 'invalid' || state.kind === 'conflict' ? 'text-oxide' : state.kind === 'retrying' ? 'text-clay' : 'text-slate';
  return (
    <p role="status" className={`text-[12px] ${tone}`} data-testid="save-state" data-kind={state.kind}>
      {text}
      {evaluating ? <span className="text-river"> · evaluating…</span> : null}
      {evaluateError ? <span className="text-oxide"> · {evaluateError}</span> : null}
    </p>
  );
}

export function SheetWorkspace({ sheetId, draft: initial, head, catalog, canEdit, role, otherSheets, extraPanels = [] }: SheetWorkspaceProps) {
  const router = useRouter();
  const { open: openPalette } = useCommandRegistry();
  const draft = useSheetDraft({ sheetId, initialVersion: initial.version, initialDocument: initial.document, canEdit });
  const { doc, apply } = draft;
  const docRef = useRef(doc);
  docRef.current = doc;
  const [selectedId, setSelectedId] = useState<string | null>(doc.blocks[0]?.id ?? null);
  const [renamingId, setRenamingId] = useState<string | null>(null);
  const selectedRef = useRef(selectedId);
  selectedRef.current = selectedId;

  const types = useMemo(() => new Map(catalog.types.map((t) => [t.id, t])), [catalog]);
  const resultsById = useMemo(() => {
    const map = new Map<string, BlockResult>();
    for (const r of Object.values(draft.results?.blocks ?? {})) map.set(r.id, r);
    return map;
  }, [draft.results]);

  const stateOf = (blockId: string, type: string): BlockState | null => {
    if (type === 'note') return null;
    const r = resultsById.get(blockId);
    if (draft.stale.has(blockId) || !r) return draft.evaluating ? 'running' : 'stale';
    if (r.status === 'ok') return r.warnings.length ? 'warning' : 'ok';
    return r.status;
  };

  const focusBlock = useCallback((id: string, field = false) => {
    let tries = 0;
    const attempt = () => {
      const section = document.querySelector<HTMLElement>(`[data-block-id="${id}"]`);
      const target = field ? section?.querySelector<HTMLElement>('.cm-content[contenteditable="true"], textarea, input') : section;
      if (target) target.focus();
      else if (tries++ < 20) setTimeout(attempt, 100);
      else section?.focus();
    };
    setTimeout(attempt, 0);
  }, []);

  /* ------------------------------------------------------------ structural edits */
  const addBlock = useCallback(
    (type: CatalogType | { id: 'note' }, init: { inputs?: Record<string, string> } = {}) => {
      const current = docRef.current;
      const block = createBlock(current, type, init);
      const at = selectedRef.current ? current.blocks.findIndex((b) => b.id === selectedRef.current) + 1 : current.blocks.length;
      apply(insertBlock(current, block, at > 0 ? at : current.blocks.length));
      setSelectedId(block.id);
      focusBlock(block.id, true);
      return block;
    },
    [apply, focusBlock],
  );

  const move = useCallback(
    (id: string, delta: number) => {
      const current = docRef.current;
      const index = current.blocks.findIndex((b) => b.id === id);
      if (index < 0) return;
      apply(moveBlock(current, id, index + delta));
      setSelectedId(id);
    },
    [apply],
  );

  const remove = useCallback(
    (id: string) => {
      const current = docRef.current;
      const index = current.blocks.findIndex((b) => b.id === id);
      const block = current.blocks[index];
      if (!block) return;
      apply(removeBlock(current, id));
      const next = current.blocks[index + 1] ?? current.blocks[index - 1];
      setSelectedId(next?.id ?? null);
      draft.setNotice(`Deleted block ${block.name}. Undo with Ctrl+Z.`);
      if (next) focusBlock(next.id);
    },
    [apply, draft, focusBlock],
  );

  const duplicate = useCallback(
    (id: string) => {
      const { doc: next, copy } = duplicateBlock(docRef.current, id);
      if (!copy) return;
      apply(next);
      setSelectedId(copy.id);
      focusBlock(copy.id);
    },
    [apply, focusBlock],
  );

  const rename = useCallback(
    async (id: string, name: string): Promise<string | null> => {
      const local = precheckBlockName(docRef.current, name, id);
      if (local) return local;
      try {
        const response = await fetch('/api/block-name', {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ name }),
        });
        const body = await response.json();
        if (!response.ok) return body?.error?.message ?? 'The name could not be checked.';
        if (body.message) return body.message as string;
      } catch {
        return 'The name could not be checked (network). Try again.';
      }
      apply(renameBlock(docRef.current, id, name));
      setRenamingId(null);
      focusBlock(id);
      return null;
    },
    [apply, focusBlock],
  );

  const actions = useMemo<BlockCardActions>(
    () => ({
      select: (id) => setSelectedId(id),
      setInput: (id, input, value) => apply(setInput(docRef.current, id, input, value), { coalesce: `input:${id}:${input}` }),
      setDisplay: (id, output, unit) => apply(setDisplayUnit(docRef.current, id, output, unit)),
      setNote: (id, note) => apply(setNote(docRef.current, id, note), { coalesce: `note:${id}` }),
      rename,
      move,
      dropOn: (dragged, target) => {
        const index = docRef.current.blocks.findIndex((b) => b.id === target);
        if (index >= 0) {
          apply(moveBlock(docRef.current, dragged, index));
          setSelectedId(dragged);
        }
      },
      duplicate,
      remove,
      addParameter: (id) => apply(addParameter(docRef.current, id)),
      renameParameter: (id, from, to) => {
        const { doc: next, error } = renameParameter(docRef.current, id, from, to);
        if (!error) apply(next);
        return error;
      },
      removeParameter: (id, key) => apply(removeParameter(docRef.current, id, key)),
      setRenaming: (id) => setRenamingId(id),
    }),
    [apply, duplicate, move, remove, rename],
  );

  /* ----------------------------------------------------------------- completion */
  const completionFor = useCallback(
    (blockId: string) => (): CompletionData => ({
      blocks: docRef.current.blocks
        .filter((b) => b.id !== blockId && b.type !== 'note')
        .map((b) => {
          const type = types.get(b.type);
          const outputs = type?.freeInputs
            ? Object.keys(b.inputs).map((k) => ({ name: k, detail: 'parameter' }))
            : (type?.outputs ?? []).map((o) => ({ name: o.name, detail: o.unit ? `${o.label} (${o.unit})` : o.label }));
          return { name: b.name, title: type?.title ?? b.type, outputs };
        }),
      units: catalog.units,
      functions: catalog.functions,
    }),
    [catalog, types],
  );
  const completions = useMemo(() => new Map(doc.blocks.map((b) => [b.id, completionFor(b.id)])), [doc.blocks, completionFor]);

  /* ------------------------------------------------------------------- palette */
  const selectedBlock = doc.blocks.find((b) => b.id === selectedId) ?? null;
  const commands = useMemo<PaletteCommand[]>(() => {
    const list: PaletteCommand[] = [
      { id: 'evaluate', title: 'Evaluate the sheet now', group: 'Sheet', keywords: ['run', 'calculate', 'recompute'], shortcut: 'Ctrl+Enter', run: draft.evaluateNow },
    ];
    if (canEdit) {
      list.push(
        { id: 'undo', title: 'Undo the last edit', group: 'Sheet', shortcut: 'Ctrl+Z', run: draft.undo },
        { id: 'redo', title: 'Redo', group: 'Sheet', shortcut: 'Ctrl+Shift+Z', run: draft.redo },
        { id: 'add-note', title: 'Add a note (markdown text)', group: 'Add block', keywords: ['text', 'narrative', 'markdown', 'comment'], shortcut: 'N', run: () => addBlock({ id: 'note' }) },
      );
      for (const type of catalog.types) {
        if (type.id === 'note') continue;
        list.push({
          id: `add-${type.id}`,
          title: `Add ${type.title}`,
          detail: type.purpose,
          group: 'Add block',
          keywords: [type.id, type.purpose, type.formula, ...type.outputs.map((o) => o.label), ...type.sources],
          run: () => addBlock(type),
        });
      }
      if (selectedBlock) {
        const name = selectedBlock.name;
        list.push(
          { id: 'rename', title: `Rename ${name}`, group: 'Block', keywords: ['name'], shortcut: 'F2', run: () => setRenamingId(selectedBlock.id) },
          { id: 'duplicate', title: `Duplicate ${name}`, group: 'Block', keywords: ['copy'], shortcut: 'Shift+D', run: () => duplicate(selectedBlock.id) },
          { id: 'delete', title: `Delete ${name}`, group: 'Block', keywords: ['remove'], shortcut: 'Delete', run: () => remove(selectedBlock.id) },
          { id: 'move-up', title: `Move ${name} up`, group: 'Block', keywords: ['reorder'], shortcut: 'Alt+↑', run: () => move(selectedBlock.id, -1) },
          { id: 'move-down', title: `Move ${name} down`, group: 'Block', keywords: ['reorder'], shortcut: 'Alt+↓', run: () => move(selectedBlock.id, 1) },
        );
      }
    }
    for (const block of doc.blocks) {
      list.push({
        id: `jump-${block.id}`,
        title: `Go to block ${block.name}`,
        detail: types.get(block.type)?.title ?? block.type,
        group: 'Go to',
        keywords: [block.type],
        run: () => {
          setSelectedId(block.id);
          focusBlock(block.id);
        },
      });
    }
    for (const sheet of otherSheets) {
      list.push({ id: `sheet-${sheet.id}`, title: `Open sheet ${sheet.title}`, group: 'Go to', keywords: ['sheet'], run: () => router.push(`/sheets/${sheet.id}`) });
    }
    return list;
  }, [addBlock, canEdit, catalog.types, doc.blocks, draft.evaluateNow, draft.redo, draft.undo, duplicate, focusBlock, move, otherSheets, remove, router, selectedBlock, types]);
  useRegisterCommands(commands);

  const formulaType = types.get('formula');
  const quickInsert = useCallback(
    (expression: string) => {
      if (formulaType) addBlock(formulaType, { inputs: { expr: expression } });
    },
    [addBlock, formulaType],
  );
  useQuickInsert(canEdit ? quickInsert : null);

  /* ------------------------------------------------------------------ keyboard */
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented) return;
      const mod = event.ctrlKey || event.metaKey;
      const typing = isTypingTarget(event.target);
      const blocks = docRef.current.blocks;
      const index = blocks.findIndex((b) => b.id === selectedRef.current);
      if (mod && event.key === 'Enter') {
        event.preventDefault();
        draft.evaluateNow();
        return;
      }
      if (event.altKey && !mod && (event.key === 'ArrowUp' || event.key === 'ArrowDown') && canEdit && selectedRef.current) {
        event.preventDefault();
        move(selectedRef.current, event.key === 'ArrowUp' ? -1 : 1);
        return;
      }
      const inExpression = Boolean((event.target as Element | null)?.closest?.('.cm-editor'));
      // Expression fields share the sheet's undo history; plain text boxes keep their own.
      if (typing && !inExpression) return;
      if (mod && event.key.toLowerCase() === 'z' && canEdit) {
        event.preventDefault();
        if (event.shiftKey) draft.redo();
        else draft.undo();
        return;
      }
      if (mod && event.key.toLowerCase() === 'y' && canEdit) {
        event.preventDefault();
        draft.redo();
        return;
      }
      if (typing) return;
      if (mod || event.altKey) return;
      const select = (i: number) => {
        const block = blocks[Math.max(0, Math.min(blocks.length - 1, i))];
        if (block) {
          event.preventDefault();
          setSelectedId(block.id);
          focusBlock(block.id);
        }
      };
      switch (event.key) {
        case 'j':
        case 'ArrowDown':
          select(index < 0 ? 0 : index + 1);
          break;
        case 'k':
        case 'ArrowUp':
          select(index < 0 ? 0 : index - 1);
          break;
        case 'Enter':
          if (selectedRef.current && (event.target as Element)?.closest?.('[data-block-id]') === document.querySelector(`[data-block-id="${selectedRef.current}"]`)) {
            event.preventDefault();
            focusBlock(selectedRef.current, true);
          }
          break;
        case 'F2':
          if (canEdit && selectedRef.current) {
            event.preventDefault();
            setRenamingId(selectedRef.current);
          }
          break;
        case 'D':
          if (canEdit && event.shiftKey && selectedRef.current) {
            event.preventDefault();
            duplicate(selectedRef.current);
          }
          break;
        case 'Delete':
          if (canEdit && selectedRef.current) {
            event.preventDefault();
            remove(selectedRef.current);
          }
          break;
        case 'n':
          if (canEdit) {
            event.preventDefault();
            addBlock({ id: 'note' });
          }
          break;
        case 'a':
          if (canEdit) {
            event.preventDefault();
            openPalette('Add ');
          }
          break;
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [addBlock, canEdit, draft, duplicate, focusBlock, move, openPalette, remove]);

  /* --------------------------------------------------------------------- view */
  const selectedType = selectedBlock ? (types.get(selectedBlock.type) ?? null) : null;
  const panels: RailPanel[] = [
    { id: 'help', title: 'Help', render: () => <HelpPanel block={selectedBlock} type={selectedType} standingCaution={catalog.standingCaution} /> },
    ...extraPanels,
  ];

  return (
    <div className="flex flex-col gap-4">
      <SheetHeader
        title={doc.title}
        site={doc.site}
        draftVersion={draft.version}
        head={head}
        state={<SaveIndicator state={draft.saveState} evaluating={draft.evaluating} evaluateError={draft.evaluateError} />}
        actions={
          <>
            <button type="button" onClick={draft.evaluateNow} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash" title="Ctrl+Enter">
              Evaluate now
            </button>
            {canEdit ? (
              <button type="button" onClick={() => openPalette('Add ')} className="h-8 rounded-[3px] border border-river bg-river px-3 text-[13px] font-medium text-river-ink hover:opacity-90" title="A">
                Add block…
              </button>
            ) : null}
          </>
        }
      >
        {!canEdit ? (
          <p className="text-[12px] text-slate">
            You are a {role} in this team: fields are read-only. You can evaluate and read everything.
          </p>
        ) : null}
      </SheetHeader>

      {draft.conflict ? (
        <div role="alert" className="rounded-[4px] border border-oxide/60 bg-chalk p-3 text-[13px]" data-testid="conflict-banner">
          <p className="font-semibold text-oxide">
            <span aria-hidden="true">⚠ </span>
            {draft.conflict.restored
              ? `This browser kept edits you had not saved, but the sheet has moved on to version ${draft.conflict.serverVersion}.`
              : `Someone else saved this sheet (now version ${draft.conflict.serverVersion}) while you were editing.`}
          </p>
          <p className="mt-1">Your edits are kept here. Re-apply them on top of the current version (block by block), or take the current version and drop yours.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <button type="button" onClick={draft.reapplyMine} className="h-8 rounded-[3px] bg-river px-3 text-[13px] font-medium text-river-ink">
              Re-apply my edits on version {draft.conflict.serverVersion}
            </button>
            <button type="button" onClick={draft.keepTheirs} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px]">
              Keep their version
            </button>
          </div>
        </div>
      ) : null}
      {draft.notice ? (
        <div role="status" className="flex items-start justify-between gap-2 rounded-[4px] border border-rule bg-wash px-3 py-2 text-[13px]">
          <span>{draft.notice}</span>
          <button type="button" onClick={() => draft.setNotice(null)} className="text-[12px] text-slate hover:text-basalt">
            Dismiss
          </button>
        </div>
      ) : null}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_340px]">
        <div className="flex min-w-0 flex-col gap-3" aria-label="Blocks" role="region">
          {doc.blocks.length === 0 ? (
            <div className="rounded-[4px] border border-dashed border-rule p-6 text-center text-slate">
              <p>This sheet has no blocks yet.</p>
              {canEdit ? <p className="mt-1">Press A or Ctrl+K and type what you want to compute (for example “Péclet”).</p> : null}
            </div>
          ) : null}
          {doc.blocks.map((block, index) => (
            <BlockCard
              key={block.id}
              block={block}
              type={types.get(block.type)}
              result={resultsById.get(block.id)}
              state={stateOf(block.id, block.type)}
              stale={draft.stale.has(block.id)}
              selected={block.id === selectedId}
              renaming={block.id === renamingId}
              canEdit={canEdit}
              index={index}
              count={doc.blocks.length}
              units={catalog.units}
              functions={catalog.functions}
              completion={completions.get(block.id)!}
              actions={actions}
            />
          ))}
          <p className="text-[12px] text-slate">
            <span aria-hidden="true">△ </span>
            {catalog.standingCaution}
          </p>
        </div>
        <SideRail panels={panels} />
      </div>
    </div>
  );
}
