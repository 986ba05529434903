'use client';

import dynamic from 'next/dynamic';
import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useMemo, useRef, useState, type ChangeEvent } from 'react';
import { BlockCard, type BlockCardActions } from '@/components/blocks/block-card';
import { CommentsPanel, useSheetComments } from '@/components/comments/comments-panel';
import { ReviewBar, allowedReviewActions, useReviewActions, type ReviewState } from '@/components/review/review-bar';
import type { ReviewNote } from '@/components/review/review-notes';
import { DraftStandingNote } from '@/components/sheet/draft-standing';
import type { DraftStanding } from '@/lib/sheet/draft-standing.server';
import type { CompletionData } from '@/components/blocks/expression-language';
import { useQuickInsert, useRegisterCommands, useCommandRegistry, type PaletteCommand } from '@/components/palette/command-registry';
import { isTypingTarget } from '@/components/palette/shortcuts';
import { roleAllows } from '@/lib/auth/permissions';
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
import { ApiError, apiFetch } from '@/lib/api-client';
import { sameJson } from '@/lib/sheet/merge';
import { withTitleSite } from '@/lib/sheet/title-site';
import type { BlockCatalogData, BlockResult, CatalogType, SheetDocument, UncertaintySettingsData } from '@/lib/sheet/types';
import type { BlockState } from './block-status';
import { HelpPanel } from './help-panel';
import { SheetHeader, type ForkItem, type ForkOrigin } from './sheet-header';
import { SideRail, type RailPanel } from './side-rail';
import { TitleSiteForm } from './title-site-form';
import { UncertaintySettings, withUncertainty } from '@/components/uncertainty/uncertainty-settings';
import { useUncertaintyCommands } from '@/components/uncertainty/use-uncertainty-commands';
import { RunProgress } from '@/components/runs/run-progress';
import { SaveIndicator } from './save-indicator';
import { useSheetDraft } from './use-sheet-draft';

// The dialogs load when first opened, so their code stays out of the page's first download.
const SaveRevisionDialog = dynamic(() => import('@/components/history/save-revision-dialog').then((m) => m.SaveRevisionDialog), { ssr: false });
const ForkDialog = dynamic(() => import('@/components/history/fork-dialog').then((m) => m.ForkDialog), { ssr: false });

type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
type Person = { id: string; name: string; email: string };

export interface SheetWorkspaceProps {
  sheetId: string;
  /** The team the sheet belongs to (imports from this page go there). */
  teamId: string;
  draft: { version: number; document: SheetDocument };
  head: { number: number; hash: string; status: SheetStatus } | null;
  /** Sign-off of the head revision (null while the sheet has no revision). */
  review: ReviewState | null;
  /** Review actions on the head revision with their notes. */
  reviewNotes?: ReviewNote[];
  /** Whether the stored draft differs from the head and the last approved revision. */
  draftStanding?: DraftStanding;
  forkedFrom: ForkOrigin | null;
  forks: ForkItem[];
  catalog: BlockCatalogData;
  canEdit: boolean;
  role: Role;
  user: { id: string; name: string };
  /** Members who may check a revision (owners and reviewers). */
  checkers: Person[];
  /** Teams the user may fork into (editor or owner there); empty: no fork. */
  forkTeams: { id: string; name: string }[];
  otherSheets: { id: string; title: string }[];
  /** Extra rail panels (comments, history...) added by later features. */
  extraPanels?: RailPanel[];
}

export function SheetWorkspace({
  sheetId,
  teamId,
  draft: initial,
  head,
  review,
  reviewNotes = [],
  draftStanding,
  forkedFrom,
  forks,
  catalog,
  canEdit,
  role,
  user,
  checkers,
  forkTeams,
  otherSheets,
  extraPanels = [],
}: SheetWorkspaceProps) {
  const router = useRouter();
  const { open: openPalette } = useCommandRegistry();
  const canComment = roleAllows(role, 'comment');
  const canFork = forkTeams.length > 0;
  const draft = useSheetDraft({ sheetId, initialVersion: initial.version, initialDocument: initial.document, canEdit });
  const { doc, apply, setNotice } = draft;
  const docRef = useRef(doc);
  docRef.current = doc;
  const [selectedId, setSelectedId] = useState<string | null>(doc.blocks[0]?.id ?? null);
  const [renamingId, setRenamingId] = useState<string | null>(null);
  const [captionId, setCaptionId] = useState<string | null>(null);
  const [railTab, setRailTab] = useState('help');
  const [editingTitle, setEditingTitle] = useState(false);
  const [dialog, setDialog] = useState<'save' | 'fork' | null>(null);
  const [transferError, setTransferError] = useState<string | null>(null);
  const [savedHead, setSavedHead] = useState(0);
  const importRef = useRef<HTMLInputElement>(null);
  const headNumber = Math.max(head?.number ?? 0, savedHead);
  const comments = useSheetComments(sheetId, { poll: true });
  const reviewActions = useReviewActions({ sheetId, revision: head?.number ?? 0 });
  // Palette review commands open the review bar's confirm step (with a note), never act at once.
  const reviewAct = reviewActions.ask;
  const selectedRef = useRef(selectedId);
  selectedRef.current = selectedId;

  const types = useMemo(() => new Map(catalog.types.map((t) => [t.id, t])), [catalog]);
  // A block's result keeps its identity while its content is unchanged, so an evaluation re-renders only
  // the cards whose results changed (the server sends every result afresh).
  const [resultsById, setResultsById] = useState(() => new Map<string, BlockResult>());
  const [resultsSeen, setResultsSeen] = useState(draft.results);
  if (resultsSeen !== draft.results) {
    setResultsSeen(draft.results);
    const next = new Map<string, BlockResult>();
    for (const r of Object.values(draft.results?.blocks ?? {})) {
      const previous = resultsById.get(r.id);
      next.set(r.id, previous && sameJson(previous, r) ? previous : r);
    }
    setResultsById(next);
  }

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
      const section = document.querySelector<HTMLElement>(`[data-block-id="${CSS.escape(id)}"]`);
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
      setNotice(`Deleted block ${block.name}. Undo with Ctrl+Z.`);
      if (next) focusBlock(next.id);
    },
    [apply, setNotice, focusBlock],
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
        const body = await apiFetch<{ message?: string | null } | null>('/api/block-name', { body: { name } });
        if (body?.message) return body.message;
      } catch (error) {
        if (!(error instanceof ApiError) || error.status === 0) return 'The name could not be checked (network). Try again.';
        return error.code === 'error' ? 'The name could not be checked.' : error.message;
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
      showComments: (id) => {
        setSelectedId(id);
        setRailTab('comments');
      },
      setCaptionEditing: (id) => {
        setCaptionId(id);
        if (id) setSelectedId(id);
      },
    }),
    [apply, duplicate, move, remove, rename],
  );

  /* ------------------------------------------------- revisions, forks, transfer */
  const onRevisionSaved = useCallback(
    (saved: { number: number; hash: string }, savedDocument: unknown) => {
      setSavedHead(saved.number);
      // After a 409 the saved document is the user's edits re-applied on the newest revision: the draft follows it.
      if (!sameJson(savedDocument, docRef.current)) apply(savedDocument as SheetDocument);
      setNotice(`Saved revision r${saved.number} (${saved.hash.slice(0, 10)}). It starts unsigned: ask for a check in the sign-off bar.`);
      router.refresh();
    },
    [apply, setNotice, router],
  );

  const exportHead = useCallback(() => {
    const link = document.createElement('a');
    link.href = `/api/sheets/${sheetId}/export`;
    link.download = '';
    document.body.appendChild(link);
    link.click();
    link.remove();
  }, [sheetId]);

  const importFile = useCallback(
    async (event: ChangeEvent<HTMLInputElement>) => {
      const file = event.target.files?.[0];
      event.target.value = '';
      if (!file) return;
      setTransferError(null);
      let parsed: unknown;
      try {
        parsed = JSON.parse(await file.text());
      } catch {
        setTransferError(`“${file.name}” is not a JSON file, so it cannot be imported.`);
        return;
      }
      try {
        const body = await apiFetch<{ sheet: { id: string } }>('/api/sheets/import', { body: { document: parsed, teamId } });
        router.push(`/sheets/${body.sheet.id}`);
      } catch (error) {
        if (!(error instanceof ApiError) || error.status === 0) {
          setTransferError('The server could not be reached; nothing was imported. Try again.');
          return;
        }
        setTransferError(`“${file.name}” was not imported: ${error.code === 'error' ? `the server answered ${error.status}` : error.message}.`);
      }
    },
    [router, teamId],
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
  // One completion source per block id; it reads the current document when asked, so edits never replace it.
  const blockIds = doc.blocks.map((b) => b.id).join(' ');
  const completions = useMemo(() => new Map(blockIds.split(' ').map((id) => [id, completionFor(id)])), [blockIds, completionFor]);

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
    // Revisions, forks and files.
    list.push({ id: 'history', title: 'Open the revision history', group: 'Revisions', keywords: ['revisions', 'log', 'versions'], run: () => router.push(`/sheets/${sheetId}/revisions`) });
    if (canEdit) {
      list.push({
        id: 'save-revision',
        title: `Save a revision (r${headNumber + 1})…`,
        group: 'Revisions',
        keywords: ['commit', 'record', 'issue', 'snapshot', 'version'],
        shortcut: 'Ctrl+S',
        run: () => setDialog('save'),
      });
    }
    if (headNumber > 1) {
      list.push({
        id: 'compare',
        title: `Compare r${headNumber - 1} with r${headNumber}`,
        group: 'Revisions',
        keywords: ['difference', 'changes', 'diff'],
        run: () => router.push(`/sheets/${sheetId}/compare?from=${headNumber - 1}&to=${headNumber}`),
      });
    }
    if (headNumber > 0 && forkedFrom?.visible && forkedFrom.revision) {
      list.push({
        id: 'compare-origin',
        title: `Compare with its origin (${forkedFrom.title} r${forkedFrom.revision})`,
        group: 'Revisions',
        keywords: ['difference', 'changes', 'fork', 'source'],
        run: () => router.push(`/sheets/${sheetId}/compare?from=${forkedFrom.sheetId}:${forkedFrom.revision}&to=${headNumber}`),
      });
    }
    if (canFork) {
      list.push({ id: 'fork', title: 'Fork this sheet for a new site…', group: 'Revisions', keywords: ['copy', 'branch', 'site', 'duplicate sheet'], run: () => setDialog('fork') });
    }
    if (headNumber > 0) {
      list.push({ id: 'export', title: `Export r${headNumber} as a JSON file`, group: 'Revisions', keywords: ['download', 'save as', 'file', 'json'], run: exportHead });
    }
    if (canEdit) {
      list.push({
        id: 'import',
        title: 'Import a sheet from a JSON file…',
        group: 'Revisions',
        keywords: ['upload', 'open file', 'load', 'json'],
        run: () => importRef.current?.click(),
      });
      list.push({ id: 'edit-title-site', title: 'Edit the title and site', group: 'Sheet', keywords: ['rename sheet', 'location', 'latitude', 'longitude', 'site notes'], run: () => setEditingTitle(true) });
    }
    // Review of the head revision: only what this role may do now (the server checks again).
    if (head && review) {
      const allowed = allowedReviewActions({ role, userId: user.id, review, isHead: true });
      if (allowed.includes('request')) {
        for (const person of checkers.filter((p) => p.id !== review.preparedBy?.id)) {
          list.push({
            id: `review-request-${person.id}`,
            title: `Ask ${person.name} to check r${head.number}`,
            group: 'Review',
            keywords: ['request review', 'checker', 'sign-off', person.email],
            run: () => void reviewAct('request', { reviewerId: person.id }),
          });
        }
      }
      if (allowed.includes('check')) {
        list.push({ id: 'review-check', title: `Mark r${head.number} checked`, group: 'Review', keywords: ['check', 'sign-off', 'review'], run: () => void reviewAct('check') });
      }
      if (allowed.includes('return')) {
        list.push({ id: 'review-return', title: `Return r${head.number} for changes`, group: 'Review', keywords: ['reject', 'sign-off', 'review'], run: () => void reviewAct('return') });
      }
      if (allowed.includes('approve')) {
        list.push({ id: 'review-approve', title: `Approve r${head.number}`, group: 'Review', keywords: ['approve', 'sign-off', 'review'], run: () => void reviewAct('approve') });
      }
    }
    if (head) {
      list.push(
        { id: 'report-open', title: `Open the calculation report of r${head.number}`, group: 'Review', keywords: ['report', 'print', 'sign-off', 'pdf'], run: () => router.push(`/sheets/${sheetId}/revisions/${head.number}/report`) },
        { id: 'report-pdf', title: `Download the PDF report of r${head.number}`, group: 'Review', keywords: ['report', 'pdf', 'print', 'export'], run: () => window.location.assign(`/api/sheets/${sheetId}/revisions/${head.number}/report.pdf`) },
      );
    }
    if (selectedBlock) {
      list.push({
        id: 'comments',
        title: `Show comments on ${selectedBlock.name}`,
        group: 'Block',
        keywords: ['discussion', 'review', 'thread', 'reply'],
        shortcut: 'C',
        run: () => setRailTab('comments'),
      });
      if (canEdit && selectedBlock.type !== 'note') {
        list.push({
          id: 'caption',
          title: `${selectedBlock.note ? 'Edit the caption of' : 'Add a caption to'} ${selectedBlock.name}`,
          group: 'Block',
          keywords: ['caption', 'note', 'description', 'markdown'],
          run: () => setCaptionId(selectedBlock.id),
        });
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
  }, [
    addBlock,
    canEdit,
    canFork,
    catalog.types,
    checkers,
    doc.blocks,
    draft.evaluateNow,
    draft.redo,
    draft.undo,
    duplicate,
    exportHead,
    focusBlock,
    forkedFrom,
    head,
    headNumber,
    move,
    otherSheets,
    remove,
    review,
    reviewAct,
    role,
    router,
    selectedBlock,
    sheetId,
    types,
    user.id,
  ]);
  useRegisterCommands(commands);
  const changeUncertainty = useCallback((settings: UncertaintySettingsData) => apply(withUncertainty(docRef.current, settings)), [apply]);
  useRegisterCommands(useUncertaintyCommands(doc, canEdit, changeUncertainty));

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
      if (mod && !event.altKey && !event.shiftKey && event.key.toLowerCase() === 's' && canEdit) {
        event.preventDefault();
        setDialog('save');
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
          if (selectedRef.current && (event.target as Element)?.closest?.('[data-block-id]') === document.querySelector(`[data-block-id="${CSS.escape(selectedRef.current)}"]`)) {
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
        case 'c':
          if (selectedRef.current) {
            event.preventDefault();
            setRailTab('comments');
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
  const openCount = selectedBlock ? (comments.data?.openByBlock[selectedBlock.id] ?? 0) : 0;
  const panels: RailPanel[] = [
    { id: 'help', title: 'Help', render: () => <HelpPanel block={selectedBlock} type={selectedType} standingCaution={catalog.standingCaution} /> },
    {
      id: 'comments',
      title: openCount ? `Comments (${openCount})` : 'Comments',
      render: () =>
        selectedBlock ? (
          <CommentsPanel
            key={selectedBlock.id}
            sheetId={sheetId}
            blockId={selectedBlock.id}
            blockName={selectedBlock.name}
            revision={head?.number ?? 0}
            userId={user.id}
            canComment={canComment}
          />
        ) : (
          <p className="text-[13px] text-slate">Select a block to read and write its comments.</p>
        ),
    },
    ...extraPanels,
  ];

  return (
    <div className="flex flex-col gap-4">
      <SheetHeader
        sheetId={sheetId}
        title={doc.title}
        site={doc.site}
        draftVersion={draft.version}
        head={head}
        forkedFrom={forkedFrom}
        forks={forks}
        onEditTitle={canEdit && !editingTitle ? () => setEditingTitle(true) : undefined}
        editor={
          editingTitle && canEdit ? (
            <TitleSiteForm
              title={doc.title}
              site={doc.site}
              onCancel={() => setEditingTitle(false)}
              onSave={(title, site) => {
                apply(withTitleSite(docRef.current, title, site));
                setEditingTitle(false);
              }}
            />
          ) : null
        }
        state={<SaveIndicator state={draft.saveState} evaluating={draft.evaluating} evaluateError={draft.evaluateError} />}
        actions={
          <>
            <button type="button" onClick={draft.evaluateNow} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash" title="Ctrl+Enter">
              Evaluate now
            </button>
            {canEdit ? (
              <button type="button" onClick={() => openPalette('Add ')} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash" title="A">
                Add block…
              </button>
            ) : null}
            {canEdit ? (
              <button
                type="button"
                onClick={() => setDialog('save')}
                className="h-8 rounded-[3px] border border-river bg-river px-3 text-[13px] font-medium text-river-ink hover:opacity-90"
                title="Ctrl+S"
              >
                Save revision…
              </button>
            ) : null}
            {canFork ? (
              <button type="button" onClick={() => setDialog('fork')} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash">
                Fork…
              </button>
            ) : null}
          </>
        }
      >
        <UncertaintySettings doc={doc} canEdit={canEdit} onChange={changeUncertainty} />
        {!canEdit ? (
          <p className="text-[12px] text-slate">
            You are a {role} in this team: fields are read-only. You can evaluate{canComment ? ', comment' : ''} and read everything.
          </p>
        ) : null}
        {draftStanding ? <DraftStandingNote sheetId={sheetId} standing={draftStanding} /> : null}
        {head && review ? (
          <ReviewBar
            key={head.number}
            sheetId={sheetId}
            revision={head.number}
            isHead
            review={review}
            role={role}
            userId={user.id}
            checkers={checkers}
            controller={reviewActions}
            notes={reviewNotes}
            draftDiffers={draftStanding?.head?.differs ?? false}
          />
        ) : (
          <p className="text-[12px] text-slate">
            No revision yet: sign-off (prepared, checked, approved) starts when a revision is saved.
          </p>
        )}
      </SheetHeader>

      {canEdit ? <input ref={importRef} type="file" accept=".json,application/json" hidden onChange={importFile} data-testid="import-file" /> : null}
      {transferError ? (
        <div role="alert" className="flex items-start justify-between gap-2 rounded-[4px] border border-oxide/60 bg-chalk px-3 py-2 text-[13px]" data-testid="import-error">
          <span>
            <span aria-hidden="true" className="text-oxide">✕ </span>
            {transferError}
          </span>
          <button type="button" onClick={() => setTransferError(null)} className="text-[12px] text-slate hover:text-basalt">
            Dismiss
          </button>
        </div>
      ) : null}
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
      {draft.activeRun ? (
        <RunProgress key={draft.activeRun.id} runId={draft.activeRun.id} onDone={draft.runFinished} onEnded={draft.runEnded} />
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
              editingCaption={block.id === captionId}
              canEdit={canEdit}
              commentsSheetId={sheetId}
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
        <SideRail panels={panels} active={railTab} onActiveChange={setRailTab} />
      </div>

      {dialog === 'save' && canEdit ? (
        <SaveRevisionDialog open onClose={() => setDialog(null)} sheetId={sheetId} baseRevision={headNumber} document={doc} onSaved={onRevisionSaved} />
      ) : null}
      {dialog === 'fork' && canFork ? (
        <ForkDialog
          open
          onClose={() => setDialog(null)}
          sheetId={sheetId}
          sourceTitle={doc.title}
          revision={head?.number}
          teams={forkTeams}
        />
      ) : null}
    </div>
  );
}
