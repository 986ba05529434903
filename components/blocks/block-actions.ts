/** What a block card may ask of the sheet; one stable object per sheet page, so memo(BlockCard) holds. */
export interface BlockCardActions {
  select: (id: string) => void;
  setInput: (id: string, input: string, value: string) => void;
  setDisplay: (id: string, output: string, unit: string) => void;
  setNote: (id: string, note: string) => void;
  rename: (id: string, name: string) => Promise<string | null>;
  move: (id: string, delta: number) => void;
  dropOn: (draggedId: string, targetId: string) => void;
  duplicate: (id: string) => void;
  remove: (id: string) => void;
  addParameter: (id: string) => void;
  renameParameter: (id: string, from: string, to: string) => string | null;
  removeParameter: (id: string, key: string) => void;
  setRenaming: (id: string | null) => void;
  /** Opens the side rail's comments on this block. */
  showComments: (id: string) => void;
  /** Starts (id) or ends (null) editing a calculation block's caption. */
  setCaptionEditing: (id: string | null) => void;
}
