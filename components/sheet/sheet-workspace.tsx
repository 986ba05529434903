'use client';

import { useCallback, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { useSheetComments } from '@/components/comments/use-comments';
import { OpenCommentCounts } from '@/components/comments/comments-panel';
import { useReviewActions } from '@/components/review/review-bar';
import { useQuickInsert, useRegisterCommands, useCommandRegistry } from '@/components/palette/command-registry';
import { roleAllows } from '@/lib/auth/permissions';
import { withTitleSite } from '@/lib/sheet/title-site';
import type { UncertaintySettingsData } from '@/lib/sheet/types';
import { BlockList } from './block-list';
import { ConflictBanner } from './conflict-banner';
import { blockRailPanels } from './sheet-rail-panels';
import { SheetHeader } from './sheet-header';
import { ImportError, SheetNotice } from './sheet-notices';
import { SheetToolbar } from './sheet-toolbar';
import { SideRail, type RailPanel } from './side-rail';
import { TitleSiteForm } from './title-site-form';
import { withUncertainty } from '@/components/uncertainty/uncertainty-settings';
import { useUncertaintyCommands } from '@/components/uncertainty/use-uncertainty-commands';
import { RunProgress } from '@/components/runs/run-progress';
import { SaveIndicator } from './save-indicator';
import { useBlockActions } from './use-block-actions';
import { useBlockSelection } from './use-block-selection';
import { useBlockResults, useCompletions } from './use-block-results';
import { useSheetCommands } from './use-sheet-commands';
import { useSheetDraft } from './use-sheet-draft';
import { useSheetKeyboard } from './use-sheet-keyboard';
import { useSheetTransfer } from './use-sheet-transfer';
import { useBlockCatalog } from './use-block-catalog';
import { SheetStanding } from './sheet-standing';
import { SheetDialogs, type SheetDialog } from './sheet-dialogs';
import { useSheetPreferences } from './use-sheet-preferences';
import type { SheetWorkspaceProps } from './sheet-workspace-props';

export type { SheetWorkspaceProps };
import { DEFAULT_SHEET_PREFERENCES } from '@/lib/sheet/preferences';


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
  forkCount,
  catalogVersion,
  canEdit,
  role,
  user,
  checkers,
  forkTeams,
  otherSheets,
  extraPanels = [],
  members = [],
  preferences: storedPreferences = DEFAULT_SHEET_PREFERENCES,
}: SheetWorkspaceProps) {
  const catalog = useBlockCatalog(catalogVersion);
  const { open: openPalette } = useCommandRegistry();
  const canComment = roleAllows(role, 'comment');
  const canFork = forkTeams.length > 0;
  const draft = useSheetDraft({ sheetId, initialVersion: initial.version, initialDocument: initial.document, canEdit });
  const { doc, apply, setNotice } = draft;
  // The rendered document, for callbacks that run on user events (written before paint, never during render).
  const docRef = useRef(doc);
  useLayoutEffect(() => {
    docRef.current = doc;
  }, [doc]);
  const { selectedId, setSelectedId, selectedRef, renamingId, setRenamingId, captionId, setCaptionId, freshIds, markFresh, revealAll, selectAdjacent, goTo, editFields } =
    useBlockSelection(docRef, initial.document.blocks[0]?.id ?? null);
  const [railTab, setRailTab] = useState('help');
  const [editingTitle, setEditingTitle] = useState(false);
  const [dialog, setDialog] = useState<SheetDialog>(null);
  const closeDialog = useCallback(() => setDialog(null), []);
  const [savedHead, setSavedHead] = useState(0);
  const headNumber = Math.max(head?.number ?? 0, savedHead);
  const comments = useSheetComments(sheetId, { poll: true });
  const reviewActions = useReviewActions({ sheetId, revision: head?.number ?? 0 });
  // Palette review commands open the review bar's confirm step (with a note), never act at once.
  const reviewAct = reviewActions.ask;
  const types = useMemo(() => new Map(catalog.types.map((t) => [t.id, t])), [catalog]);
  const { resultsById, stateOf } = useBlockResults(draft);
  const completions = useCompletions({ doc, docRef, catalog, types });
  const { addBlock: addBlockNow, move, remove, duplicate, actions } = useBlockActions({
    apply,
    setNotice,
    docRef,
    selectedRef,
    setSelectedId,
    setRenamingId,
    setCaptionId,
    setRailTab,
  });
  const { transferError, setTransferError, importRef, importFile, chooseImport, exportHead } = useSheetTransfer({ sheetId, teamId });
  // Blocks added in this visit: their empty required inputs read “needs input” until left or saved.
  const addBlock = useCallback(
    (...args: Parameters<typeof addBlockNow>) => {
      const block = addBlockNow(...args);
      markFresh(block.id);
      return block;
    },
    [addBlockNow, markFresh],
  );
  const { prefs, changePrefs } = useSheetPreferences({ sheetId, canEdit, stored: storedPreferences, setNotice });

  /* ---------------------------------------------------- palette and keyboard */
  const openSave = useCallback(() => {
    revealAll();
    setDialog('save');
  }, [setDialog, revealAll]);
  const { evaluateNow: evaluateDraft } = draft;
  const evaluateNow = useCallback(() => {
    revealAll();
    evaluateDraft();
  }, [evaluateDraft, revealAll]);
  const openFork = useCallback(() => setDialog('fork'), [setDialog]);
  const editTitle = useCallback(() => setEditingTitle(true), [setEditingTitle]);
  const showComments = useCallback(() => setRailTab('comments'), [setRailTab]);
  const openAdd = useCallback(() => openPalette('Add '), [openPalette]);
  const selectedBlock = doc.blocks.find((b) => b.id === selectedId) ?? null;
  const commands = useSheetCommands({
    sheetId,
    canEdit,
    canFork,
    catalogTypes: catalog.types,
    types,
    blocks: doc.blocks,
    selectedBlock,
    head,
    headNumber,
    review,
    role,
    userId: user.id,
    checkers,
    forkedFrom,
    otherSheets,
    evaluateNow,
    undo: draft.undo,
    redo: draft.redo,
    addBlock,
    selectAdjacent,
    editFields,
    openAdd,
    duplicate,
    remove,
    move,
    startRename: setRenamingId,
    editCaption: setCaptionId,
    editTitle,
    showComments,
    goTo,
    openSave,
    openFork,
    exportHead,
    chooseImport,
    reviewAct,
  });
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

  // Every key runs one of these commands (keymap.ts); the shortcuts sheet lists them from the registry.
  useSheetKeyboard(commands);

  /* --------------------------------------------------------------------- view */
  const panels: RailPanel[] = [
    ...blockRailPanels({
      sheetId,
      block: selectedBlock,
      type: selectedBlock ? (types.get(selectedBlock.type) ?? null) : null,
      standingCaution: catalog.standingCaution,
      openComments: selectedBlock ? (comments.data?.openByBlock[selectedBlock.id] ?? 0) : 0,
      revision: head?.number ?? 0,
      userId: user.id,
      canComment,
      teamId,
      members,
    }),
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
        forkCount={forkCount}
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
        actions={<SheetToolbar canEdit={canEdit} canFork={canFork} onEvaluate={evaluateNow} onAdd={openAdd} onSave={openSave} onFork={openFork} />}
      >
        <SheetStanding
          sheetId={sheetId}
          doc={doc}
          canEdit={canEdit}
          canComment={canComment}
          role={role}
          userId={user.id}
          prefs={prefs}
          onPrefsChange={changePrefs}
          onUncertaintyChange={changeUncertainty}
          draftStanding={draftStanding}
          head={head}
          review={review}
          reviewNotes={reviewNotes}
          reviewActions={reviewActions}
          checkers={checkers}
        />
      </SheetHeader>

      {canEdit ? <input ref={importRef} type="file" accept=".json,application/json" hidden onChange={importFile} data-testid="import-file" /> : null}
      {transferError ? <ImportError message={transferError} onDismiss={() => setTransferError(null)} /> : null}
      {draft.conflict ? <ConflictBanner conflict={draft.conflict} onReapply={draft.reapplyMine} onKeepTheirs={draft.keepTheirs} /> : null}
      {draft.activeRun ? (
        <RunProgress key={draft.activeRun.id} runId={draft.activeRun.id} onDone={draft.runFinished} onEnded={draft.runEnded} />
      ) : null}
      {draft.notice ? <SheetNotice message={draft.notice} onDismiss={() => draft.setNotice(null)} /> : null}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_340px]">
        <OpenCommentCounts counts={comments.data?.openByBlock}>
        <BlockList
          sheetId={sheetId}
          blocks={doc.blocks}
          types={types}
          resultsById={resultsById}
          stateOf={stateOf}
          stale={draft.stale}
          selectedId={selectedId}
          renamingId={renamingId}
          captionId={captionId}
          canEdit={canEdit}
          units={catalog.units}
          functions={catalog.functions}
          standingCaution={catalog.standingCaution}
          completions={completions}
          actions={actions}
          freshIds={freshIds}
          significantFigures={prefs.significantFigures}
          siFolded={prefs.siFolded}
        />
        </OpenCommentCounts>
        <SideRail panels={panels} active={railTab} onActiveChange={setRailTab} />
      </div>

      <SheetDialogs
        dialog={dialog}
        onClose={closeDialog}
        sheetId={sheetId}
        doc={doc}
        canEdit={canEdit}
        canFork={canFork}
        headNumber={headNumber}
        forkTeams={forkTeams}
        forkRevision={head?.number}
        apply={apply}
        setNotice={setNotice}
        onHeadSaved={setSavedHead}
      />
    </div>
  );
}
