/**
 * A small SVG element tree: the drawings are built as data, so that the browser can render them as
 * elements (and attach its handlers) and the PDF report can take them as SVG text.
 */
export interface SvgNode {
  tag: string;
  attrs: Record<string, string | number | undefined>;
  children: SvgNode[];
  text?: string;
}

export function el(
  tag: string,
  attrs: SvgNode['attrs'] = {},
  children: (SvgNode | null | false)[] = [],
): SvgNode {
  return { tag, attrs, children: children.filter((child): child is SvgNode => Boolean(child)) };
}

export function text(attrs: SvgNode['attrs'], content: string): SvgNode {
  return { tag: 'text', attrs, children: [], text: content };
}

const escapes: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};
const escape = (value: string) => value.replace(/[&<>"']/g, (char) => escapes[char]!);

/** Numbers with at most two decimals: exact enough for a drawing, short in the file. */
export const n = (value: number): number => Math.round(value * 100) / 100;

/** The tree as SVG text; the root gets the SVG namespace. */
export function renderSvg(node: SvgNode, root = true): string {
  const attrs = Object.entries(
    root && node.tag === 'svg'
      ? { xmlns: 'http://www.w3.org/2000/svg', ...node.attrs }
      : node.attrs,
  )
    .filter(([, value]) => value !== undefined)
    .map(([key, value]) => ` ${key}="${escape(String(value))}"`)
    .join('');
  const inner =
    (node.text !== undefined ? escape(node.text) : '') +
    node.children.map((child) => renderSvg(child, false)).join('');
  return inner ? `<${node.tag}${attrs}>${inner}</${node.tag}>` : `<${node.tag}${attrs}/>`;
}

/** A <title> child: the tooltip and accessible name of its parent. */
export function title(content: string): SvgNode {
  return { tag: 'title', attrs: {}, children: [], text: content };
}
