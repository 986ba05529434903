'use client';

import { closeBrackets, closeCompletion } from '@codemirror/autocomplete';
import { Compartment, EditorState, Prec, type Extension } from '@codemirror/state';
import { EditorView, keymap, placeholder as placeholderText } from '@codemirror/view';
import { useEffect, useRef } from 'react';
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

function editableExtension(readOnly: boolean): Extension {
  return [EditorView.editable.of(!readOnly), EditorState.readOnly.of(readOnly)];
}

/**
 * One-line expression editor on CodeMirror's view and state only (no basic setup: it keeps the
 * sheet page light). Undo and redo go to the sheet's own history, so Ctrl+Z is one stack.
 */
export default function ExpressionField(props: ExpressionFieldProps) {
  const host = useRef<HTMLDivElement>(null);
  const view = useRef<EditorView | null>(null);
  const latest = useRef(props);
  latest.current = props;
  const attributes = useRef(new Compartment());
  const editable = useRef(new Compartment());

  useEffect(() => {
    if (!host.current) return;
    const p = latest.current;
    const state = EditorState.create({
      doc: p.value,
      extensions: [
        expressionLanguage(new Set(p.units), new Set(p.functions)),
        expressionHighlight,
        expressionCompletion(() => latest.current.completion()),
        closeBrackets(),
        placeholderText(p.placeholder ?? ''),
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
            latest.current.onBlur?.();
            return false;
          },
        }),
        EditorView.updateListener.of((update) => {
          if (update.docChanged) {
            const text = update.state.doc.toString();
            if (text !== latest.current.value) latest.current.onChange(text);
          }
        }),
        attributes.current.of(attributeExtension(p)),
        editable.current.of(editableExtension(p.readOnly)),
      ],
    });
    view.current = new EditorView({ state, parent: host.current });
    return () => {
      view.current?.destroy();
      view.current = null;
    };
    // The editor is made once (everything it reads is a ref); later prop changes are applied below.
  }, []);

  // Outside changes (undo, rename, merge) replace the text.
  useEffect(() => {
    const v = view.current;
    if (!v) return;
    const current = v.state.doc.toString();
    if (current !== props.value) v.dispatch({ changes: { from: 0, to: current.length, insert: props.value } });
  }, [props.value]);

  const { labelId, describedBy, invalid, readOnly } = props;
  useEffect(() => {
    view.current?.dispatch({ effects: attributes.current.reconfigure(attributeExtension({ labelId, describedBy, invalid, readOnly })) });
  }, [labelId, describedBy, invalid, readOnly]);

  useEffect(() => {
    view.current?.dispatch({ effects: editable.current.reconfigure(editableExtension(props.readOnly)) });
  }, [props.readOnly]);

  return <div ref={host} className="expr-field" data-invalid={props.invalid ? 'true' : undefined} data-readonly={props.readOnly ? 'true' : undefined} id={props.id} />;
}
