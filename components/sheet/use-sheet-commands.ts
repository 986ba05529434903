'use client';

import { useRouter } from 'next/navigation';
import { useMemo } from 'react';
import type { PaletteCommand } from '@/components/palette/command-registry';
import { chordLabel } from '@/components/palette/keymap';
import { allowedReviewActions, type ReviewAction, type ReviewState } from '@/components/review/review-bar';
import type { SheetStatus } from '@/components/ui/status';
import type { CatalogType, SheetBlock } from '@/lib/sheet/types';
import type { ForkOrigin } from './sheet-header';
import type { TeamRole as Role } from '@/models';
import type { PublicUser as Person } from '@/lib/db/users';


/**
 * The sheet page's palette commands: evaluate, undo/redo, add a block of each type, act on the selected
 * block, revisions, forks and files, review of the head revision (only what this role may do now; the
 * server checks again), the report, and going to a block or another sheet.
 */
export function useSheetCommands({
  sheetId,
  canEdit,
  canFork,
  catalogTypes,
  types,
  blocks,
  selectedBlock,
  head,
  headNumber,
  review,
  role,
  userId,
  checkers,
  forkedFrom,
  otherSheets,
  evaluateNow,
  undo,
  redo,
  addBlock,
  duplicate,
  remove,
  move,
  startRename,
  editCaption,
  editTitle,
  showComments,
  goTo,
  openSave,
  openFork,
  exportHead,
  chooseImport,
  reviewAct,
  selectAdjacent,
  editFields,
  openAdd,
}: {
  /** Selects the next (+1) or previous (−1) block and focuses its card. */
  selectAdjacent: (delta: number) => void;
  /** Moves focus into the first field of a block. */
  editFields: (id: string) => void;
  /** Opens the palette on “Add ”. */
  openAdd: () => void;
  sheetId: string;
  canEdit: boolean;
  canFork: boolean;
  catalogTypes: CatalogType[];
  types: Map<string, CatalogType>;
  blocks: SheetBlock[];
  selectedBlock: SheetBlock | null;
  head: { number: number; hash: string; status: SheetStatus } | null;
  headNumber: number;
  review: ReviewState | null;
  role: Role;
  userId: string;
  checkers: Person[];
  forkedFrom: ForkOrigin | null;
  otherSheets: { id: string; title: string }[];
  evaluateNow: () => void;
  undo: () => void;
  redo: () => void;
  addBlock: (type: CatalogType | { id: 'note' }) => unknown;
  duplicate: (id: string) => void;
  remove: (id: string) => void;
  move: (id: string, delta: number) => void;
  startRename: (id: string) => void;
  editCaption: (id: string) => void;
  editTitle: () => void;
  showComments: () => void;
  goTo: (id: string) => void;
  openSave: () => void;
  openFork: () => void;
  exportHead: () => void;
  chooseImport: () => void;
  reviewAct: (action: ReviewAction, options?: { reviewerId?: string }) => unknown;
}): PaletteCommand[] {
  const router = useRouter();
  return useMemo<PaletteCommand[]>(() => {
    const list: PaletteCommand[] = [
      { id: 'evaluate', title: 'Evaluate the sheet now', group: 'Sheet', keywords: ['run', 'calculate', 'recompute'], shortcut: chordLabel('evaluate'), run: evaluateNow },
    ];
    if (blocks.length > 0) {
      list.push(
        { id: 'select-next', title: 'Select the next block', group: 'Block', keywords: ['down', 'move focus'], shortcut: chordLabel('select-next'), run: () => selectAdjacent(1) },
        { id: 'select-previous', title: 'Select the previous block', group: 'Block', keywords: ['up', 'move focus'], shortcut: chordLabel('select-previous'), run: () => selectAdjacent(-1) },
      );
    }
    if (selectedBlock && selectedBlock.type !== 'note') {
      list.push({ id: 'edit-fields', title: `Edit the fields of ${selectedBlock.name}`, group: 'Block', keywords: ['focus', 'inputs', 'type'], shortcut: chordLabel('edit-fields'), run: () => editFields(selectedBlock.id) });
    }
    if (canEdit) {
      list.push(
        { id: 'undo', title: 'Undo the last edit', group: 'Sheet', shortcut: chordLabel('undo'), run: undo },
        { id: 'redo', title: 'Redo', group: 'Sheet', shortcut: `${chordLabel('redo')} / ${chordLabel('redo-y')}`, run: redo },
        { id: 'add-block', title: 'Add a block…', group: 'Add block', keywords: ['new', 'insert', 'calculation'], shortcut: chordLabel('add-block'), run: openAdd },
        { id: 'add-note', title: 'Add a note (markdown text)', group: 'Add block', keywords: ['text', 'narrative', 'markdown', 'comment'], shortcut: chordLabel('add-note'), run: () => addBlock({ id: 'note' }) },
      );
      for (const type of catalogTypes) {
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
          { id: 'rename', title: `Rename ${name}`, group: 'Block', keywords: ['name'], shortcut: chordLabel('rename'), run: () => startRename(selectedBlock.id) },
          { id: 'duplicate', title: `Duplicate ${name}`, group: 'Block', keywords: ['copy'], run: () => duplicate(selectedBlock.id) },
          { id: 'delete', title: `Delete ${name}`, group: 'Block', keywords: ['remove'], shortcut: chordLabel('delete'), run: () => remove(selectedBlock.id) },
          { id: 'move-up', title: `Move ${name} up`, group: 'Block', keywords: ['reorder'], shortcut: chordLabel('move-up'), run: () => move(selectedBlock.id, -1) },
          { id: 'move-down', title: `Move ${name} down`, group: 'Block', keywords: ['reorder'], shortcut: chordLabel('move-down'), run: () => move(selectedBlock.id, 1) },
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
        shortcut: chordLabel('save-revision'),
        run: openSave,
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
      list.push({ id: 'fork', title: 'Fork this sheet for a new site…', group: 'Revisions', keywords: ['copy', 'branch', 'site', 'duplicate sheet'], run: openFork });
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
        run: chooseImport,
      });
      list.push({ id: 'edit-title-site', title: 'Edit the title and site', group: 'Sheet', keywords: ['rename sheet', 'location', 'latitude', 'longitude', 'site notes'], run: editTitle });
    }
    // Review of the head revision: only what this role may do now (the server checks again).
    if (head && review) {
      const allowed = allowedReviewActions({ role, userId: userId, review, isHead: true });
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
        // eslint-disable-next-line @next/next/no-location-assign-relative-destination -- a PDF download from a route handler (attachment), not a page the client router can show
        { id: 'report-pdf', title: `Download the PDF report of r${head.number}`, group: 'Review', keywords: ['report', 'pdf', 'print', 'export'], run: () => window.location.assign(`/api/sheets/${sheetId}/revisions/${head.number}/report.pdf`) },
      );
    }
    if (selectedBlock) {
      list.push({
        id: 'comments',
        title: `Show comments on ${selectedBlock.name}`,
        group: 'Block',
        keywords: ['discussion', 'review', 'thread', 'reply'],
        shortcut: chordLabel('comments'),
        run: showComments,
      });
      if (canEdit && selectedBlock.type !== 'note') {
        list.push({
          id: 'caption',
          title: `${selectedBlock.note ? 'Edit the caption of' : 'Add a caption to'} ${selectedBlock.name}`,
          group: 'Block',
          keywords: ['caption', 'note', 'description', 'markdown'],
          run: () => editCaption(selectedBlock.id),
        });
      }
    }
    for (const block of blocks) {
      list.push({
        id: `jump-${block.id}`,
        title: `Go to block ${block.name}`,
        detail: types.get(block.type)?.title ?? block.type,
        group: 'Go to',
        keywords: [block.type],
        run: () => goTo(block.id),
      });
    }
    for (const sheet of otherSheets) {
      list.push({ id: `sheet-${sheet.id}`, title: `Open sheet ${sheet.title}`, group: 'Go to', keywords: ['sheet'], run: () => router.push(`/sheets/${sheet.id}`) });
    }
    return list;
  }, [
    addBlock,
    selectAdjacent,
    editFields,
    openAdd,
    canEdit,
    canFork,
    catalogTypes,
    checkers,
    blocks,
    evaluateNow,
    redo,
    undo,
    duplicate,
    exportHead,
    chooseImport,
    editCaption,
    editTitle,
    goTo,
    openFork,
    openSave,
    showComments,
    startRename,
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
    userId,
  ]);
}
