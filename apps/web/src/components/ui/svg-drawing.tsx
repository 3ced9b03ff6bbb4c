import { createElement, type ReactNode, type SVGProps } from 'react';
import type { SvgNode } from '@emberline/drawings/svg';

const camel = (name: string) =>
  name.replace(/-([a-z])/g, (_, letter: string) => letter.toUpperCase());

/** React props from SVG attribute names: data-* and aria-* stay, class → className, the rest camelCase. */
function props(attrs: SvgNode['attrs']): Record<string, string | number> {
  const out: Record<string, string | number> = {};
  for (const [key, value] of Object.entries(attrs)) {
    if (value === undefined || key === 'xmlns') continue;
    const name =
      key === 'class'
        ? 'className'
        : key.startsWith('data-') || key.startsWith('aria-')
          ? key
          : camel(key);
    out[name] = value;
  }
  return out;
}

function render(node: SvgNode, key?: number): ReactNode {
  return createElement(
    node.tag,
    { key, ...props(node.attrs) },
    node.text,
    ...node.children.map((child, index) => render(child, index)),
  );
}

/**
 * Draws an SVG element tree from @emberline/drawings as React elements, so that the browser shows
 * the same picture as the report; `svgProps` adds what only the browser needs (handlers, classes).
 */
export function SvgDrawing({
  drawing,
  svgProps,
}: {
  drawing: SvgNode;
  svgProps?: SVGProps<SVGSVGElement>;
}) {
  return createElement(
    'svg',
    { ...props(drawing.attrs), ...svgProps },
    drawing.text,
    ...drawing.children.map((child, index) => render(child, index)),
  );
}
