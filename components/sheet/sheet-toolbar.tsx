'use client';

/** The sheet's main actions beside its title: evaluate, add a block, save a revision, fork. */
export function SheetToolbar({
  canEdit,
  canFork,
  onEvaluate,
  onAdd,
  onSave,
  onFork,
}: {
  canEdit: boolean;
  canFork: boolean;
  onEvaluate: () => void;
  onAdd: () => void;
  onSave: () => void;
  onFork: () => void;
}) {
  return (
    <>
      <button type="button" onClick={onEvaluate} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash" title="Ctrl+Enter">
        Evaluate now
      </button>
      {canEdit ? (
        <button type="button" onClick={onAdd} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash" title="Alt+A">
          Add block…
        </button>
      ) : null}
      {canEdit ? (
        <button
          type="button"
          onClick={onSave}
          className="h-8 rounded-[3px] border border-river bg-river px-3 text-[13px] font-medium text-river-ink hover:opacity-90"
          title="Ctrl+S"
        >
          Save revision…
        </button>
      ) : null}
      {canFork ? (
        <button type="button" onClick={onFork} className="h-8 rounded-[3px] border border-rule bg-chalk px-3 text-[13px] hover:bg-wash">
          Fork…
        </button>
      ) : null}
    </>
  );
}
