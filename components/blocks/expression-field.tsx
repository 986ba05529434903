'use client';

import { closeBrackets, closeCompletion } from '@codemirror/autocomplete';
import { EditorState, Prec, type Extension } from '@codemirror/state';
import { EditorView, keymap } from '@codemirror/view';
import CodeMirror from '@uiw/react-codemirror';
import { useCallback, useMemo, useState } from 'react';
import { useLatest } from '@/components/ui/use-latest';
import { expressionCompletion, expressionHighlight, expressionLanguage, type CompletionData } from './expression-language';

export interface ExpressionFieldProps {
  id: string;
  labelId: string;
  describedBy?: string;
  value: string;
  placeholder?: string;
  readOnly: boolean;
  invalid: boolean;
  completion: () => CompletionData;
  units: readonly string[];
  functions: readonly string[];
  onChange: (value: string) => void;
  /** The field lost focus (the user left it). */
  onBlur?: () => void;
}

function attributeExtension(p: Pick<ExpressionFieldProps, 'labelId' | 'describedBy' | 'invalid' | 'readOnly'>): Extension {
  return EditorView.contentAttributes.of({
    'aria-labelledby': p.labelId,
    ...(p.describedBy ? { 'aria-describedby': p.describedBy } : {}),
    ...(p.invalid ? { 'aria-invalid': 'true' } : {}),
    ...(p.readOnly ? { 'aria-readonly': 'true' } : {}),
    'aria-multiline': 'false',
    spellcheck: 'false',
    autocapitalize: 'off',
    autocorrect: 'off',
  });
}

/**
 * One-line expression editor: @uiw/react-codemirror with its basic setup, theme and Tab indentation off, and
 * only the extensions the field uses (the expression language and highlighting, completion, closing brackets,
 * one line, the accessible attributes). Undo and redo go to the sheet's own history, so Ctrl+Z is one stack.
 * Outside changes of the value (undo, rename, merge) replace the text; the package does not echo them back
 * through onChange.
 */
export default function ExpressionField(props: ExpressionFieldProps) {
  const latest = useLatest(props);

  // Made once (the callbacks read the latest props through `latest`), so the editor's state (an open
  // completion list) survives the package's reconfiguration when the attributes below change.
  const [base] = useState(() => [
    expressionLanguage(new Set(props.units), new Set(props.functions)),
    expressionHighlight,
    expressionCompletion(() => latest().completion()),
    closeBrackets(),
    EditorView.lineWrapping,
    // One line: Enter adds nothing; pasted line breaks become spaces.
    Prec.high(keymap.of([{ key: 'Enter', run: () => true }])),
    // Tab leaves the field as everywhere else: an open completion list closes first (never
    // accepted by Tab, never left open over the next field).
    Prec.highest(
      keymap.of([
        { key: 'Tab', run: (v) => (closeCompletion(v), false) },
        { key: 'Shift-Tab', run: (v) => (closeCompletion(v), false) },
      ]),
    ),
    EditorState.transactionFilter.of((tr) => {
      if (!tr.docChanged || tr.newDoc.lines <= 1) return tr;
      const text = tr.newDoc.toString().replace(/\s*\n\s*/g, ' ');
      return [tr, { changes: { from: 0, to: tr.newDoc.length, insert: text }, sequential: true }];
    }),
    // Leaving the field (blur, Tab, a click elsewhere) closes its completion list.
    EditorView.domEventHandlers({
      blur: (_event, v) => {
        closeCompletion(v);
        latest().onBlur?.();
        return false;
      },
    }),
  ]);
  const { labelId, describedBy, invalid, readOnly } = props;
  const attributes = useMemo(() => attributeExtension({ labelId, describedBy, invalid, readOnly }), [labelId, describedBy, invalid, readOnly]);
  const extensions = useMemo(() => [...base, attributes], [base, attributes]);

  // Stable: a new onChange would make the package reconfigure the editor.
  const onChange = useCallback(
    (text: string) => {
      const current = latest();
      if (text !== current.value) current.onChange(text);
    },
    [latest],
  );

  return (
    <CodeMirror
      value={props.value}
      onChange={onChange}
      extensions={extensions}
      basicSetup={false}
      indentWithTab={false}
      theme="none"
      placeholder={props.placeholder ?? ''}
      editable={!props.readOnly}
      readOnly={props.readOnly}
      className="expr-field"
      data-invalid={props.invalid ? 'true' : undefined}
      data-readonly={props.readOnly ? 'true' : undefined}
      id={props.id}
    />
  );
}
