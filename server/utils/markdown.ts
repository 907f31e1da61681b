import { marked } from 'marked'
import { FilterXSS } from 'xss'

// marked renders; js-xss keeps only harmless tags and attributes (no script, no event handlers, no
// javascript: links), so markdown from requesters can be shown as HTML.
const filter = new FilterXSS({
  whiteList: {
    p: [], br: [], strong: [], em: [], b: [], i: [], code: [], pre: [], blockquote: [], hr: [],
    ul: [], ol: ['start'], li: [], h1: [], h2: [], h3: [], h4: [], h5: [], h6: [],
    a: ['href', 'title'], table: [], thead: [], tbody: [], tr: [], th: ['align'], td: ['align'], del: [], sup: [], sub: [],
  },
  stripIgnoreTag: true,
  stripIgnoreTagBody: ['script', 'style', 'iframe', 'object'],
  onTagAttr(tag, name, value) {
    if (tag === 'a' && name === 'href' && !/^(https?:|mailto:|\/|#)/i.test(value.trim())) return 'href="#"'
    return undefined
  },
})

export function renderMarkdown(source: string): string {
  return filter.process(marked.parse(source, { async: false, gfm: true, breaks: true }) as string)
}
