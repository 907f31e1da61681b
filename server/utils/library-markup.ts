import { FilterXSS } from 'xss'

/**
 * @nuxt/content 3 stores a page body as "minimark": `{ type: 'minimark', value: nodes }`, where a node is a
 * string or `[tag, props, ...children]`. The library needs it twice over: as plain text for the search index
 * and the PDF sheet, and as HTML for the item page (sanitised, since it goes into v-html).
 */
export type MinimarkNode = string | [string, Record<string, unknown>, ...MinimarkNode[]]
export interface MinimarkBody {
  type: string
  value: MinimarkNode[]
}

const voidTags = new Set(['br', 'hr', 'img'])
const blockTags = new Set(['p', 'h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'li', 'blockquote', 'pre', 'tr', 'ul', 'ol', 'table'])

function nodesOf(body: unknown): MinimarkNode[] {
  const b = body as MinimarkBody | null
  return Array.isArray(b?.value) ? b.value : []
}

function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

const codeInText = /\b[DCG]-[A-Z]{2,6}-\d{2}\b/g

/** Escapes text, turning the codes of known items into links to their pages. */
function renderText(text: string, linkable: ReadonlySet<string>): string {
  let html = ''
  let last = 0
  for (const m of text.matchAll(codeInText)) {
    if (!linkable.has(m[0])) continue
    html += `${escapeHtml(text.slice(last, m.index))}<a href="/library/${m[0]}">${m[0]}</a>`
    last = m.index + m[0].length
  }
  return html + escapeHtml(text.slice(last))
}

function renderNode(node: MinimarkNode, linkable: ReadonlySet<string>): string {
  if (typeof node === 'string') return renderText(node, linkable)
  const [tag, props, ...children] = node
  // No links inside links or code.
  const inner = tag === 'a' || tag === 'code' || tag === 'pre' ? new Set<string>() : linkable
  const attrs = Object.entries(props ?? {})
    .filter(([name, value]) => /^[a-z][a-z0-9-]*$/i.test(name) && (typeof value === 'string' || typeof value === 'number'))
    .map(([name, value]) => ` ${name}="${escapeHtml(String(value))}"`)
    .join('')
  if (voidTags.has(tag)) return `<${tag}${attrs}>`
  return `<${tag}${attrs}>${children.map(c => renderNode(c, inner)).join('')}</${tag}>`
}

// Only the markup the library's markdown produces; anything else is dropped, not escaped into view.
const sanitiser = new FilterXSS({
  whiteList: {
    h2: [], h3: [], h4: [], p: [], ul: [], ol: [], li: [], blockquote: [], strong: [], em: [], code: [], pre: [],
    table: [], thead: [], tbody: [], tr: [], th: [], td: [], br: [], hr: [], sup: [], sub: [],
    a: ['href', 'title'],
  },
  stripIgnoreTag: true,
  stripIgnoreTagBody: ['script', 'style'],
})

/** The body as sanitised HTML; codes of the items in `linkable` become links to their pages. */
export function minimarkToHtml(body: unknown, linkable: ReadonlySet<string> = new Set()): string {
  return sanitiser.process(nodesOf(body).map(n => renderNode(n, linkable)).join('\n'))
}

function textOf(node: MinimarkNode, out: string[]) {
  if (typeof node === 'string') {
    out.push(node)
    return
  }
  const [tag, , ...children] = node
  for (const child of children) textOf(child, out)
  if (blockTags.has(tag)) out.push('\n')
}

/** The body as plain text, one line per paragraph, heading or list item. */
export function minimarkToText(body: unknown): string {
  const out: string[] = []
  for (const node of nodesOf(body)) textOf(node, out)
  return out.join('').split('\n').map(line => line.replace(/\s+/g, ' ').trim()).filter(Boolean).join('\n')
}

/** A body's blocks in order — heading, paragraph, list item or quote — for the PDF sheet. */
export interface TextBlock {
  kind: 'heading' | 'paragraph' | 'item' | 'quote'
  text: string
  /** For numbered list items, the number. */
  number?: number
}

export function minimarkToBlocks(body: unknown): TextBlock[] {
  const blocks: TextBlock[] = []
  const flat = (node: MinimarkNode) => {
    const out: string[] = []
    textOf(node, out)
    return out.join('').replace(/\s+/g, ' ').trim()
  }
  const walk = (node: MinimarkNode, inQuote: boolean) => {
    if (typeof node === 'string') {
      if (node.trim()) blocks.push({ kind: inQuote ? 'quote' : 'paragraph', text: node.replace(/\s+/g, ' ').trim() })
      return
    }
    const [tag, , ...children] = node
    if (/^h[1-6]$/.test(tag)) blocks.push({ kind: 'heading', text: flat(node) })
    else if (tag === 'ul' || tag === 'ol') {
      let n = 0
      for (const child of children) {
        if (typeof child !== 'string' && child[0] === 'li') {
          n++
          blocks.push({ kind: 'item', text: flat(child), number: tag === 'ol' ? n : undefined })
        }
      }
    }
    else if (tag === 'blockquote') for (const child of children) walk(child, true)
    else if (tag === 'p' || tag === 'pre') blocks.push({ kind: inQuote ? 'quote' : 'paragraph', text: flat(node) })
    else for (const child of children) walk(child, inQuote)
  }
  for (const node of nodesOf(body)) walk(node, false)
  return blocks.filter(b => b.text)
}
