/**
 * A small reader for the report's own SVG and HTML markup, for tests: it lists elements with their attributes
 * (entities decoded) and direct text, and reports unbalanced tags. It understands exactly what the renderer
 * writes (double-quoted attributes, no CDATA) and is not a general XML parser.
 */

export interface MarkupElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  /** Text directly inside the element (not in child elements), entities decoded. */
  text: string;
  /** Text inside the element including its children. */
  deepText: string;
}

const HTML_VOID_ELEMENTS = new Set(['meta', 'br', 'hr', 'img', 'input', 'link', 'source', 'wbr', 'col', 'area', 'base', 'embed', 'track']);

export function decodeEntities(text: string): string {
  return text.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|amp|lt|gt|quot|apos);/g, (_, entity: string) => {
    if (entity === 'amp') return '&';
    if (entity === 'lt') return '<';
    if (entity === 'gt') return '>';
    if (entity === 'quot') return '"';
    if (entity === 'apos') return "'";
    const code = entity.startsWith('#x') ? Number.parseInt(entity.slice(2), 16) : Number.parseInt(entity.slice(1), 10);
    return String.fromCodePoint(code);
  });
}

export function parseMarkup(markup: string): { readonly elements: readonly MarkupElement[]; readonly problems: readonly string[] } {
  const elements: MarkupElement[] = [];
  const problems: string[] = [];
  const stack: MarkupElement[] = [];
  const token = /<!--[\s\S]*?-->|<!DOCTYPE[^>]*>|<\/([A-Za-z][\w:-]*)\s*>|<([A-Za-z][\w:-]*)((?:\s+[\w:-]+(?:="[^"]*")?)*)\s*(\/?)>|([^<]+)|(<)/g;
  for (let match = token.exec(markup); match !== null; match = token.exec(markup)) {
    const [, closing, opening, attributeText, selfClosing, text, strayLessThan] = match;
    if (strayLessThan !== undefined) {
      problems.push(`stray '<' at ${match.index}`);
    } else if (text !== undefined) {
      const decoded = decodeEntities(text);
      const top = stack[stack.length - 1];
      if (top !== undefined) top.text += decoded;
      for (const open of stack) open.deepText += decoded;
    } else if (opening !== undefined) {
      const attributes: Record<string, string> = {};
      for (const attribute of (attributeText ?? '').matchAll(/([\w:-]+)(?:="([^"]*)")?/g)) {
        const name = attribute[1]!;
        if (name in attributes) problems.push(`duplicate attribute ${name} on <${opening}>`);
        attributes[name] = decodeEntities(attribute[2] ?? '');
      }
      const element: MarkupElement = { name: opening, attributes, text: '', deepText: '' };
      elements.push(element);
      if (selfClosing !== '/' && !HTML_VOID_ELEMENTS.has(opening.toLowerCase())) stack.push(element);
    } else if (closing !== undefined) {
      const top = stack.pop();
      if (top === undefined || top.name !== closing) problems.push(`</${closing}> closes <${top?.name ?? 'nothing'}> at ${match.index}`);
    }
  }
  for (const open of stack) problems.push(`<${open.name}> never closed`);
  return { elements, problems };
}

/** Elements with a given data-role (and optionally a given flow). */
export function byRole(elements: readonly MarkupElement[], role: string, flow?: string): MarkupElement[] {
  return elements.filter((element) => element.attributes['data-role'] === role && (flow === undefined || element.attributes['data-flow'] === flow));
}

export function numberAttribute(element: MarkupElement | undefined, name: string): number {
  const text = element?.attributes[name];
  if (text === undefined) throw new Error(`missing attribute ${name}`);
  const value = Number(text);
  if (!Number.isFinite(value)) throw new Error(`attribute ${name}="${text}" is not a number`);
  return value;
}

/**
 * The linear map from px to data value that an axis's ticks define (least squares over every tick), with the
 * largest misfit of a tick, px. Reading the scale back from the drawing checks geometry and labels together.
 */
export function axisFromTicks(elements: readonly MarkupElement[], axis: 'x' | 'y'): { toValue(px: number): number; toPx(value: number): number; pxPerUnit: number; misfitPx: number } {
  const ticks = byRole(elements, `${axis}-tick`).map((tick) => ({ value: numberAttribute(tick, 'data-value'), px: numberAttribute(tick, axis === 'x' ? 'x1' : 'y1') }));
  if (ticks.length < 2) throw new Error(`fewer than two ${axis} ticks`);
  const n = ticks.length;
  const meanPx = ticks.reduce((sum, tick) => sum + tick.px, 0) / n;
  const meanValue = ticks.reduce((sum, tick) => sum + tick.value, 0) / n;
  const slope =
    ticks.reduce((sum, tick) => sum + (tick.px - meanPx) * (tick.value - meanValue), 0) / ticks.reduce((sum, tick) => sum + (tick.value - meanValue) ** 2, 0);
  const toPx = (value: number): number => meanPx + slope * (value - meanValue);
  const misfitPx = Math.max(...ticks.map((tick) => Math.abs(toPx(tick.value) - tick.px)));
  return { toPx, toValue: (px) => meanValue + (px - meanPx) / slope, pxPerUnit: Math.abs(slope), misfitPx };
}

/** Vertices of an SVG path made of M, L, H, V and Z commands (absolute), as written by the renderer. */
export function pathVertices(d: string): { x: number; y: number; move: boolean }[] {
  const vertices: { x: number; y: number; move: boolean }[] = [];
  let x = 0;
  let y = 0;
  for (const command of d.matchAll(/([MLHVZ])([^MLHVZ]*)/g)) {
    const numbers = (command[2] ?? '').trim().split(/[\s,]+/).filter((part) => part !== '').map(Number);
    switch (command[1]) {
      case 'M':
      case 'L':
        for (let index = 0; index + 1 < numbers.length; index += 2) {
          x = numbers[index]!;
          y = numbers[index + 1]!;
          vertices.push({ x, y, move: command[1] === 'M' && index === 0 });
        }
        break;
      case 'H':
        x = numbers[0]!;
        vertices.push({ x, y, move: false });
        break;
      case 'V':
        y = numbers[0]!;
        vertices.push({ x, y, move: false });
        break;
      default:
        break;
    }
  }
  return vertices;
}

/** The SVG fragments of an HTML page. */
export function svgFragments(html: string): string[] {
  return html.match(/<svg\b[\s\S]*?<\/svg>/g) ?? [];
}
