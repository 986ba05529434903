/**
 * Notes and captions in the PDF, rendered as markdown (CommonMark, parsed by mdast-util-from-markdown):
 * paragraphs, headings, **bold**, *italics*, `code` and code blocks, ordered and bulleted lists (nested),
 * block quotes, rules and links, a link printed as its text followed by its address in brackets (a printed
 * page has nothing to click). Raw HTML is never interpreted: it prints as the text the author wrote, as on the page.
 */
import type { ReactNode } from 'react';
import { Text, View } from '@react-pdf/renderer';
import { fromMarkdown } from 'mdast-util-from-markdown';
import type { Nodes, Parents, PhrasingContent, RootContent } from 'mdast';

const MONO = 'DejaVu Sans Mono';
const SLATE = '#5b6670';
/** A note is at most a few thousand characters (the document bounds it); deep nesting is cut short. */
const MAX_DEPTH = 12;

function linkText(node: Nodes): string {
  if ('value' in node && typeof node.value === 'string') return node.value;
  if ('children' in node) return (node.children as Nodes[]).map(linkText).join('');
  return '';
}

/** Inline content: nested Text runs (react-pdf allows Text inside Text). */
function inline(nodes: PhrasingContent[], depth: number): ReactNode[] {
  return nodes.map((node, i) => {
    if (depth > MAX_DEPTH) return null;
    switch (node.type) {
      case 'text':
        return node.value;
      case 'strong':
        return (
          <Text key={i} style={{ fontWeight: 'bold' }}>
            {inline(node.children, depth + 1)}
          </Text>
        );
      case 'emphasis':
        return (
          <Text key={i} style={{ fontStyle: 'italic' }}>
            {inline(node.children, depth + 1)}
          </Text>
        );
      case 'delete':
        return (
          <Text key={i} style={{ textDecoration: 'line-through' }}>
            {inline(node.children, depth + 1)}
          </Text>
        );
      case 'inlineCode':
        return (
          <Text key={i} style={{ fontFamily: MONO, fontSize: 8.5 }}>
            {node.value}
          </Text>
        );
      case 'break':
        return '\n';
      case 'link': {
        const text = linkText(node).trim();
        const url = node.url;
        return (
          <Text key={i}>
            <Text style={{ textDecoration: 'underline' }}>{inline(node.children, depth + 1)}</Text>
            {url && url !== text ? <Text style={{ color: SLATE }}>{` (${url})`}</Text> : null}
          </Text>
        );
      }
      case 'image':
        return node.alt ? `[image: ${node.alt}${node.url ? ` (${node.url})` : ''}]` : null;
      case 'html':
        return node.value;
      default:
        return 'children' in node ? inline((node as Parents).children as PhrasingContent[], depth + 1) : null;
    }
  });
}

function blocks(nodes: RootContent[], depth: number): ReactNode[] {
  return nodes.map((node, i) => {
    if (depth > MAX_DEPTH) return null;
    switch (node.type) {
      case 'paragraph':
        return (
          <Text key={i} style={{ marginTop: 2 }}>
            {inline(node.children, depth + 1)}
          </Text>
        );
      case 'heading':
        return (
          <Text key={i} style={{ marginTop: 4, fontWeight: 'bold', fontSize: node.depth <= 2 ? 10.5 : 9.5 }}>
            {inline(node.children, depth + 1)}
          </Text>
        );
      case 'code':
        return (
          <Text key={i} style={{ marginTop: 2, fontFamily: MONO, fontSize: 8, backgroundColor: '#f1f2f3', padding: 3 }}>
            {node.value}
          </Text>
        );
      case 'blockquote':
        return (
          <View key={i} style={{ marginTop: 2, paddingLeft: 8, borderLeftWidth: 1.5, borderLeftColor: '#c9ced2' }}>
            {blocks(node.children, depth + 1)}
          </View>
        );
      case 'list': {
        const start = node.start ?? 1;
        return (
          <View key={i} style={{ marginTop: 2 }}>
            {node.children.map((item, k) => (
              <View key={k} style={{ flexDirection: 'row' }}>
                <Text style={{ width: node.ordered ? 16 : 10 }}>{node.ordered ? `${start + k}.` : '•'}</Text>
                <View style={{ flex: 1 }}>
                  {item.checked === true || item.checked === false ? <Text>{item.checked ? '[x]' : '[ ]'}</Text> : null}
                  {blocks(item.children, depth + 1)}
                </View>
              </View>
            ))}
          </View>
        );
      }
      case 'thematicBreak':
        return <View key={i} style={{ marginVertical: 4, borderBottomWidth: 0.5, borderBottomColor: '#c9ced2' }} />;
      case 'html':
        return (
          <Text key={i} style={{ marginTop: 2 }}>
            {node.value}
          </Text>
        );
      default:
        // Anything else the parser may give (definitions, tables from extensions): its text, never markup.
        return 'children' in node || 'value' in node ? (
          <Text key={i} style={{ marginTop: 2 }}>
            {linkText(node as Nodes)}
          </Text>
        ) : null;
    }
  });
}

/** A note or caption as react-pdf elements. */
export function PdfMarkdown({ text }: { text: string }) {
  const tree = fromMarkdown(text.replace(/\r\n?/g, '\n'));
  return <View>{blocks(tree.children, 0)}</View>;
}
