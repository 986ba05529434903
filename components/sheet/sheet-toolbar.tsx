'use client';

import { Button } from '@/components/ui/button';

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
      <Button onClick={onEvaluate} title="Ctrl+Enter">
        Evaluate now
      </Button>
      {canEdit ? (
        <Button onClick={onAdd} title="Alt+A">
          Add block…
        </Button>
      ) : null}
      {canEdit ? (
        <Button variant="primary" onClick={onSave} title="Ctrl+S">
          Save revision…
        </Button>
      ) : null}
      {canFork ? (
        <Button onClick={onFork}>Fork…</Button>
      ) : null}
    </>
  );
}
