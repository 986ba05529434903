import { Fragment, useMemo, type ReactNode } from 'react';
import { fromMarkdown } from 'mdast-util-from-markdown';
import type { Definition, Nodes, Parents, PhrasingContent, RootContent } from 'mdast';
import { ByteBoundedLru } from '@/lib/cache/byte-bounded-lru';

/**
 * Notes and captions as markdown (CommonMark, parsed by mdast-util-from-markdown: the parser the PDF
 * report uses, lib/report/pdf-markdown.tsx), drawn as React elements from the syntax tree. Nothing a note
 * says becomes live HTML: raw HTML is shown as text, and only http(s) and mailto links are made (any other
 * address, relative ones and `javascript:` among them, leaves the link's text only). Images are shown as
 * their description (a note never loads anything). The `#` and `##` headings draw as h3, deeper ones as h4,
 * below the block's own heading.
 */
export function NoteMarkdown({ text }: { text: string }) {
  const content = useMemo(() => drawnMarkdown(text), [text]);
  return <>{content}</>;
}

/**
 * The drawn elements of recent texts. Parsing is the costly part (on the server, one note's parse was about
 * 4 % of a sheet page's CPU), and the same notes are drawn for every request of the same sheet. React elements
 * are immutable descriptions, so one drawing serves every render. Bounded: 256 texts, about 8 MB (a text is
 * counted at 16 bytes a character: its key and its tree); a text over 64 kB is drawn every time.
 */
const drawings = new ByteBoundedLru<string, { nodes: ReactNode[]; bytes: number }>(256, 8 * 1024 * 1024, (drawing) => drawing.bytes);
const MAX_KEPT_TEXT = 64 * 1024;

function drawnMarkdown(text: string): ReactNode[] {
  if (text.length > MAX_KEPT_TEXT) return renderMarkdown(text);
  const kept = drawings.get(text);
  if (kept) return kept.nodes;
  const nodes = renderMarkdown(text);
  drawings.set(text, { nodes, bytes: text.length * 16 });
  return nodes;
}

/** A note is bounded in length by the document's limits; nesting deeper than this is drawn as plain text. */
const MAX_DEPTH = 12;
const SAFE_URL = /^(https?:|mailto:)/i;

interface Context {
  definitions: Map<string, string>;
}

export function renderMarkdown(text: string): ReactNode[] {
  const tree = fromMarkdown(text.replace(/\r\n?/g, '\n'));
  const definitions = new Map<string, string>();
  const collect = (node: Nodes) => {
    if (node.type === 'definition') definitions.set((node as Definition).identifier, (node as Definition).url);
    if ('children' in node) (node.children as Nodes[]).forEach(collect);
  };
  collect(tree);
  return blocks(tree.children, { definitions }, 0, false);
}

function plain(node: Nodes): string {
  if ('value' in node && typeof node.value === 'string') return node.value;
  if ('children' in node) return (node.children as Nodes[]).map(plain).join('');
  if (node.type === 'image' || node.type === 'imageReference') return node.alt ?? '';
  return '';
}

function link(key: number, url: string | undefined, children: ReactNode): ReactNode {
  const href = url?.trim();
  if (!href || !SAFE_URL.test(href)) return <Fragment key={key}>{children}</Fragment>;
  return (
    <a key={key} href={href} rel="noopener noreferrer nofollow" target="_blank">
      {children}
    </a>
  );
}

function inline(nodes: PhrasingContent[], ctx: Context, depth: number): ReactNode[] {
  return nodes.map((node, i): ReactNode => {
    if (depth > MAX_DEPTH) return plain(node);
    switch (node.type) {
      case 'text':
        // A soft line break inside a paragraph is a space.
        return node.value.replace(/\n/g, ' ');
      case 'html':
        return node.value;
      case 'strong':
        return <strong key={i}>{inline(node.children, ctx, depth + 1)}</strong>;
      case 'emphasis':
        return <em key={i}>{inline(node.children, ctx, depth + 1)}</em>;
      case 'inlineCode':
        return <code key={i}>{node.value}</code>;
      case 'break':
        return <br key={i} />;
      case 'link':
        return link(i, node.url, inline(node.children, ctx, depth + 1));
      case 'linkReference':
        return link(i, ctx.definitions.get(node.identifier), inline(node.children, ctx, depth + 1));
      case 'image':
      case 'imageReference':
        return node.alt ?? '';
      default:
        return 'children' in node ? inline((node as Parents).children as PhrasingContent[], ctx, depth + 1) : plain(node);
    }
  });
}

function blocks(nodes: RootContent[], ctx: Context, depth: number, tight: boolean): ReactNode[] {
  return nodes.map((node, i): ReactNode => {
    if (depth > MAX_DEPTH) return <p key={i}>{plain(node)}</p>;
    switch (node.type) {
      case 'paragraph':
        // Items of a tight list hold their text without a paragraph around it.
        return tight ? inline(node.children, ctx, depth + 1) : <p key={i}>{inline(node.children, ctx, depth + 1)}</p>;
      case 'heading':
        return node.depth <= 2 ? <h3 key={i}>{inline(node.children, ctx, depth + 1)}</h3> : <h4 key={i}>{inline(node.children, ctx, depth + 1)}</h4>;
      case 'html':
        // Raw HTML is text, never markup.
        return <p key={i}>{node.value}</p>;
      case 'code':
        return (
          <pre key={i}>
            <code>{node.value}</code>
          </pre>
        );
      case 'blockquote':
        return <blockquote key={i}>{blocks(node.children, ctx, depth + 1, false)}</blockquote>;
      case 'list': {
        const items = node.children.map((item, k) => <li key={k}>{blocks(item.children, ctx, depth + 1, !(node.spread || item.spread))}</li>);
        if (!node.ordered) return <ul key={i}>{items}</ul>;
        return node.start != null && node.start !== 1 ? (
          <ol key={i} start={node.start}>
            {items}
          </ol>
        ) : (
          <ol key={i}>{items}</ol>
        );
      }
      case 'thematicBreak':
        return <hr key={i} />;
      case 'definition':
        return null;
      default:
        return 'children' in node || 'value' in node ? <p key={i}>{plain(node as Nodes)}</p> : null;
    }
  });
}
