'use client';

import dynamic from 'next/dynamic';
import { useRouter } from 'next/navigation';
import { useCallback, useMemo, useRef, useState } from 'react';
import { useSheetComments } from '@/components/comments/comments-panel';
import { ReviewBar, useReviewActions, type ReviewState } from '@/components/review/review-bar';
import type { ReviewNote } from '@/components/review/review-notes';
import { DraftStandingNote } from '@/components/sheet/draft-standing';
import type { DraftStanding } from '@/lib/sheet/draft-standing.server';
import { useQuickInsert, useRegisterCommands, useCommandRegistry } from '@/components/palette/command-registry';
import { roleAllows } from '@/lib/auth/permissions';
import type { SheetStatus } from '@/components/ui/status';
import { sameJson } from '@/lib/sheet/merge';
import { withTitleSite } from '@/lib/sheet/title-site';
import type { BlockCatalogData, SheetDocument, UncertaintySettingsData } from '@/lib/sheet/types';
import { BlockList } from './block-list';
import { ConflictBanner } from './conflict-banner';
import { blockRailPanels } from './sheet-rail-panels';
import { SheetHeader, type ForkItem, type ForkOrigin } from './sheet-header';
import { ImportError, SheetNotice } from './sheet-notices';
import { SheetToolbar } from './sheet-toolbar';
import { SideRail, type RailPanel } from './side-rail';
import { TitleSiteForm } from './title-site-form';
import { UncertaintySettings, withUncertainty } from '@/components/uncertainty/uncertainty-settings';
import { useUncertaintyCommands } from '@/components/uncertainty/use-uncertainty-commands';
import { RunProgress } from '@/components/runs/run-progress';
import { SaveIndicator } from './save-indicator';
import { focusBlock, useBlockActions } from './use-block-actions';
import { useBlockResults, useCompletions } from './use-block-results';
import { useSheetCommands } from './use-sheet-commands';
import { useSheetDraft } from './use-sheet-draft';
import { useSheetKeyboard } from './use-sheet-keyboard';
import { useSheetTransfer } from './use-sheet-transfer';
import { DisplaySettings } from './display-settings';
import { apiFetch } from '@/lib/api-client';
import type { MentionPerson } from '@/lib/comments/mentions';
import { DEFAULT_SHEET_PREFERENCES, type SheetPreferences } from '@/lib/sheet/preferences';
import type { TeamRole as Role } from '@/models';
import type { PublicUser as Person } from '@/lib/db/users';

// The dialogs load when first opened, so their code stays out of the page's first download.
const SaveRevisionDialog = dynamic(() => import('@/components/history/save-revision-dialog').then((m) => m.SaveRevisionDialog), { ssr: false });
const ForkDialog = dynamic(() => import('@/components/history/fork-dialog').then((m) => m.ForkDialog), { ssr: false });


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
  /** The team's members (a comment can mention them). */
  members?: MentionPerson[];
  /** Display preferences stored beside the sheet (CONTRACT §6b). */
  preferences?: SheetPreferences;
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
  members = [],
  preferences: storedPreferences = DEFAULT_SHEET_PREFERENCES,
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
  const [savedHead, setSavedHead] = useState(0);
  const headNumber = Math.max(head?.number ?? 0, savedHead);
  const comments = useSheetComments(sheetId, { poll: true });
  const reviewActions = useReviewActions({ sheetId, revision: head?.number ?? 0 });
  // Palette review commands open the review bar's confirm step (with a note), never act at once.
  const reviewAct = reviewActions.ask;
  const selectedRef = useRef(selectedId);
  selectedRef.current = selectedId;
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
  const [freshIds, setFreshIds] = useState<ReadonlySet<string>>(() => new Set());
  const addBlock = useCallback(
    (...args: Parameters<typeof addBlockNow>) => {
      const block = addBlockNow(...args);
      setFreshIds((s) => new Set([...s, block.id]));
      return block;
    },
    [addBlockNow],
  );
  const revealAll = useCallback(() => setFreshIds((s) => (s.size ? new Set() : s)), []);
  const [prefs, setPrefs] = useState<SheetPreferences>(storedPreferences);
  const changePrefs = useCallback(
    (change: Partial<SheetPreferences>) => {
      setPrefs((p) => ({ ...p, ...change }));
      // Stored for the sheet by owners and editors; a failure leaves this view changed and says so.
      if (canEdit) {
        apiFetch(`/api/sheets/${sheetId}/preferences`, { method: 'PUT', body: change }).catch(() =>
          setNotice('The display setting could not be stored for the sheet; it applies to this view only.'),
        );
      }
    },
    [canEdit, sheetId, setNotice],
  );

  const onRevisionSaved = useCallback(
    (saved: { number: number; hash: string; evaluating?: boolean }, savedDocument: unknown) => {
      setSavedHead(saved.number);
      // After a 409 the saved document is the user's edits re-applied on the newest revision: the draft follows it.
      if (!sameJson(savedDocument, docRef.current)) apply(savedDocument as SheetDocument);
      setNotice(
        saved.evaluating
          ? `Saved revision r${saved.number} (${saved.hash.slice(0, 10)}). It is too costly to evaluate at once: a long run stores its results (see the revision page); a check can be asked for after that.`
          : `Saved revision r${saved.number} (${saved.hash.slice(0, 10)}). It starts unsigned: ask for a check in the sign-off bar.`,
      );
      router.refresh();
    },
    [apply, setNotice, router],
  );

  /* ---------------------------------------------------- palette and keyboard */
  const openSave = useCallback(() => {
    revealAll();
    setDialog('save');
  }, [setDialog, revealAll]);
  const evaluateNow = useCallback(() => {
    revealAll();
    draft.evaluateNow();
  }, [draft, revealAll]);
  const selectAdjacent = useCallback((delta: number) => {
    const blocks = docRef.current.blocks;
    const index = blocks.findIndex((b) => b.id === selectedRef.current);
    const block = blocks[Math.max(0, Math.min(blocks.length - 1, index < 0 ? 0 : index + delta))];
    if (block) {
      setSelectedId(block.id);
      focusBlock(block.id);
    }
  }, []);
  const editFields = useCallback((id: string) => focusBlock(id, true), []);
  const openFork = useCallback(() => setDialog('fork'), [setDialog]);
  const editTitle = useCallback(() => setEditingTitle(true), [setEditingTitle]);
  const showComments = useCallback(() => setRailTab('comments'), [setRailTab]);
  const openAdd = useCallback(() => openPalette('Add '), [openPalette]);
  const goTo = useCallback((id: string) => {
    setSelectedId(id);
    focusBlock(id);
  }, []);
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
        <DisplaySettings preferences={prefs} shared={canEdit} onChange={changePrefs} />
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
      {transferError ? <ImportError message={transferError} onDismiss={() => setTransferError(null)} /> : null}
      {draft.conflict ? <ConflictBanner conflict={draft.conflict} onReapply={draft.reapplyMine} onKeepTheirs={draft.keepTheirs} /> : null}
      {draft.activeRun ? (
        <RunProgress key={draft.activeRun.id} runId={draft.activeRun.id} onDone={draft.runFinished} onEnded={draft.runEnded} />
      ) : null}
      {draft.notice ? <SheetNotice message={draft.notice} onDismiss={() => draft.setNotice(null)} /> : null}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_340px]">
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
        <SideRail panels={panels} active={railTab} onActiveChange={setRailTab} />
      </div>

      {dialog === 'save' && canEdit ? (
        <SaveRevisionDialog open onClose={() => setDialog(null)} sheetId={sheetId} baseRevision={headNumber} document={doc} onSaved={onRevisionSaved} />
      ) : null}
      {dialog === 'fork' && canFork ? (
        <ForkDialog open onClose={() => setDialog(null)} sheetId={sheetId} sourceTitle={doc.title} revision={head?.number} teams={forkTeams} />
      ) : null}
    </div>
  );
}
