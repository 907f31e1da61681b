// The declaration of svg-to-pdfkit lives in server/types; the test tsconfig does not include that folder.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference
/// <reference path="../types/svg-to-pdfkit.d.ts" />
import PDFDocument from 'pdfkit'
import SVGtoPDF from 'svg-to-pdfkit'

/**
 * Perpend's small PDF engine: A4 documents set in the app's own font (Source Sans 3, shipped with the
 * server in server/assets/fonts), a running head and foot with page numbers, headings, paragraphs, lists,
 * key-value tables, caution boxes and vector drawings from SVG. Detail sheets use it; response packs reuse it.
 */

export const pdfColours = {
  ink: '#17212b',
  muted: '#44535f',
  rule: '#cbd3d9',
  clay: '#9a3f1c',
  cautionFill: '#fbefd2',
  cautionBar: '#7a4f00',
  panel: '#f2eee4',
} as const

const fontFiles = {
  'body': 'source-sans-3-latin-400-normal.woff',
  'bold': 'source-sans-3-latin-600-normal.woff',
  'greek': 'source-sans-3-greek-400-normal.woff',
  'greek-bold': 'source-sans-3-greek-600-normal.woff',
} as const
type FontName = keyof typeof fontFiles

let fontData: Promise<Record<FontName, Buffer>> | null = null

/** The font files, read once from the server's bundled assets (they travel with the built server). */
function loadFonts(): Promise<Record<FontName, Buffer>> {
  fontData ??= (async () => {
    const storage = useStorage('assets:server')
    const entries = await Promise.all(Object.entries(fontFiles).map(async ([name, file]) => {
      const raw = await storage.getItemRaw<Buffer | Uint8Array | string>(`fonts/${file}`)
      if (!raw) throw new Error(`PDF font ${file} is missing from server/assets/fonts`)
      const buffer = typeof raw === 'string' ? Buffer.from(raw, 'base64') : Buffer.from(raw)
      return [name, buffer] as const
    }))
    return Object.fromEntries(entries) as Record<FontName, Buffer>
  })().catch((error) => {
    fontData = null
    throw error
  })
  return fontData
}

// The shipped font files are subsets: Latin (with the degree sign, ², ±, ×, en dash, minus) and Greek (ψ, λ, θ).
const greekChar = /[\u0370-\u03FF]/
const latinChar = /[\u0020-\u00FF\u0131\u0152\u0153\u02BB\u02BC\u02C6\u02DA\u02DC\u2000-\u206F\u20AC\u2122\u2191\u2193\u2212\u2215]/
// Signs in neither subset, written as a reader would type them.
const substitutes: Record<string, string> = { '≈': '~', '≥': '>=', '≤': '<=', '→': '->', '←': '<-', '✓': 'yes', '✗': 'no', '\t': ' ' }

interface Run { greek: boolean, text: string }

/** Splits text into runs by the font subset that has their glyphs. */
export function fontRuns(text: string): Run[] {
  const runs: Run[] = []
  for (const ch of text) {
    let piece = ch
    let greek = false
    if (greekChar.test(ch)) greek = true
    else if (!latinChar.test(ch)) piece = substitutes[ch] ?? '?'
    const last = runs.at(-1)
    if (last && last.greek === greek) last.text += piece
    else runs.push({ greek, text: piece })
  }
  return runs
}

export interface TextStyle {
  size?: number
  bold?: boolean
  color?: string
  indent?: number
  width?: number
  align?: 'left' | 'right' | 'center' | 'justify'
  /** Space after the block, in points. */
  gap?: number
}

export interface PdfMeta {
  title: string
  subject?: string
  /** Left of the running head on every page. */
  runningHead: string
  /** Right of the running head (e.g. "Demo data — invented"). */
  runningHeadRight?: string
  /** Left of the foot on every page, beside the page number. */
  footNote?: string
}

const A4 = { width: 595.28, height: 841.89 }
const MARGIN = { top: 64, bottom: 64, left: 56, right: 56 }

export class PdfWriter {
  readonly doc: PDFKit.PDFDocument
  private readonly chunks: Buffer[] = []
  private readonly done: Promise<Buffer>

  constructor(fonts: Record<FontName, Buffer>, private readonly meta: PdfMeta) {
    this.doc = new PDFDocument({
      size: 'A4',
      margins: MARGIN,
      bufferPages: true,
      autoFirstPage: true,
      info: { Title: meta.title, Subject: meta.subject ?? meta.title, Author: 'Perpend', Creator: 'Perpend' },
    })
    for (const [name, data] of Object.entries(fonts)) this.doc.registerFont(name, data)
    this.doc.font('body')
    this.done = new Promise((resolve, reject) => {
      this.doc.on('data', (c: Buffer) => this.chunks.push(c))
      this.doc.on('end', () => resolve(Buffer.concat(this.chunks)))
      this.doc.on('error', reject)
    })
  }

  get contentWidth(): number {
    return A4.width - MARGIN.left - MARGIN.right
  }

  get left(): number {
    return MARGIN.left
  }

  /** Starts a new page when less than `height` points are left on this one. */
  ensureSpace(height: number) {
    if (this.doc.y + height > A4.height - MARGIN.bottom) this.doc.addPage()
  }

  /** Height a text takes at a style, measured in the Latin face (Greek letters are the same width class). */
  measure(text: string, style: TextStyle = {}): number {
    this.doc.font(style.bold ? 'bold' : 'body').fontSize(style.size ?? 10)
    return this.doc.heightOfString(fontRuns(text).map(r => r.text).join(''), { width: (style.width ?? this.contentWidth) - (style.indent ?? 0) })
  }

  /** Writes text at the cursor, switching to the Greek face for Greek letters. */
  text(text: string, style: TextStyle = {}, x = this.left + (style.indent ?? 0)) {
    const runs = fontRuns(text)
    const width = (style.width ?? this.contentWidth) - (style.indent ?? 0)
    this.doc.fillColor(style.color ?? pdfColours.ink).fontSize(style.size ?? 10)
    runs.forEach((run, i) => {
      const face = run.greek ? (style.bold ? 'greek-bold' : 'greek') : (style.bold ? 'bold' : 'body')
      this.doc.font(face)
      const options: PDFKit.Mixins.TextOptions = { width, align: style.align ?? 'left', continued: i < runs.length - 1, lineGap: 1.5 }
      if (i === 0) this.doc.text(run.text, x, this.doc.y, options)
      else this.doc.text(run.text, options)
    })
    if (style.gap) this.doc.y += style.gap
  }

  heading(text: string, level: 1 | 2 | 3 = 2) {
    const size = level === 1 ? 18 : level === 2 ? 13 : 11
    // A heading keeps at least two lines of what follows on its page.
    this.ensureSpace(size * 2 + 40)
    if (level > 1) this.doc.y += level === 2 ? 8 : 4
    this.text(text, { size, bold: true, color: level === 1 ? pdfColours.ink : pdfColours.clay, gap: level === 1 ? 6 : 3 })
  }

  paragraph(text: string, style: TextStyle = {}) {
    this.ensureSpace(Math.min(this.measure(text, style), 60))
    this.text(text, { gap: 5, ...style })
  }

  /** A list item with its marker hung in the left margin of the text. */
  listItem(text: string, marker = '•', style: TextStyle = {}) {
    const indent = (style.indent ?? 0) + 16
    this.ensureSpace(Math.min(this.measure(text, { ...style, indent }), 40))
    const y = this.doc.y
    this.doc.font('body').fontSize(style.size ?? 10).fillColor(pdfColours.muted)
      .text(marker, this.left + indent - 14, y, { width: 12, lineBreak: false })
    this.doc.y = y
    this.text(text, { gap: 3, ...style, indent })
  }

  /** A two-column table of labels and values; `note` is set small under it. */
  keyValues(rows: Array<[string, string]>, options: { labelWidth?: number, note?: string } = {}) {
    const labelWidth = options.labelWidth ?? 150
    const valueWidth = this.contentWidth - labelWidth - 12
    for (const [label, value] of rows) {
      const h = Math.max(this.measure(label, { width: labelWidth, bold: true, size: 9.5 }), this.measure(value, { width: valueWidth, size: 9.5 })) + 8
      this.ensureSpace(h)
      const y = this.doc.y
      this.doc.save().moveTo(this.left, y).lineTo(this.left + this.contentWidth, y).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
      this.doc.y = y + 4
      this.text(label, { width: labelWidth, bold: true, size: 9.5, color: pdfColours.muted })
      this.doc.y = y + 4
      this.text(value, { width: valueWidth, size: 9.5 }, this.left + labelWidth + 12)
      this.doc.y = y + h
    }
    const end = this.doc.y
    this.doc.save().moveTo(this.left, end).lineTo(this.left + this.contentWidth, end).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
    this.doc.y = end + 4
    if (options.note) this.text(options.note, { size: 8.5, color: pdfColours.muted, gap: 6 })
    else this.doc.y += 4
  }

  /** A tinted box with a dark bar at its left edge, for a caution the reader must not miss. */
  caution(text: string, title = 'Caution') {
    const pad = 8
    const inner = this.contentWidth - 2 * pad - 4
    const h = this.measure(title, { bold: true, width: inner }) + this.measure(text, { width: inner, size: 9.5 }) + 2 * pad + 2
    this.ensureSpace(h + 6)
    const y = this.doc.y
    this.doc.save()
      .rect(this.left, y, this.contentWidth, h).fill(pdfColours.cautionFill)
      .rect(this.left, y, 4, h).fill(pdfColours.cautionBar)
      .restore()
    this.doc.y = y + pad
    this.text(title, { bold: true, width: inner + 4 + pad }, this.left + 4 + pad)
    this.doc.y += 2
    this.text(text, { size: 9.5, width: inner + 4 + pad }, this.left + 4 + pad)
    this.doc.y = y + h + 8
  }

  /**
   * Places an SVG drawing as vectors, scaled to the content width and at most `maxHeight` tall, centred.
   * Greek letters in its text are set in the Greek face, like the rest of the document.
   */
  svg(svg: string, options: { viewWidth: number, viewHeight: number, maxHeight?: number, frame?: boolean }) {
    const scale = Math.min(this.contentWidth / options.viewWidth, (options.maxHeight ?? 420) / options.viewHeight)
    const width = options.viewWidth * scale
    const height = options.viewHeight * scale
    this.ensureSpace(height + 8)
    const x = this.left + (this.contentWidth - width) / 2
    const y = this.doc.y
    const withGreek = svg.replace(/>([^<]*)</g, (_, t: string) => `>${t.replace(/[\u0370-\u03FF]+/g, g => `<tspan font-family="perpend-greek">${g}</tspan>`)}<`)
    SVGtoPDF(this.doc, withGreek, x, y, {
      width,
      height,
      preserveAspectRatio: 'xMidYMid meet',
      fontCallback: (family, bold) => (family.includes('perpend-greek') ? (bold ? 'greek-bold' : 'greek') : (bold ? 'bold' : 'body')),
      warningCallback: () => {},
    })
    if (options.frame) this.doc.save().rect(x, y, width, height).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
    this.doc.font('body')
    this.doc.x = this.left
    this.doc.y = y + height + 8
  }

  /** Draws the running head and foot on every page, numbers the pages, and returns the finished file. */
  async finish(): Promise<Buffer> {
    const range = this.doc.bufferedPageRange()
    for (let i = range.start; i < range.start + range.count; i++) {
      this.doc.switchToPage(i)
      // Writing in the margins must not trigger PDFKit's automatic page break.
      const margins = { ...this.doc.page.margins }
      this.doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 }
      const headY = MARGIN.top - 28
      this.doc.font('bold').fontSize(8.5).fillColor(pdfColours.muted)
      this.doc.text(this.meta.runningHead, MARGIN.left, headY, { width: this.contentWidth / 2, lineBreak: false })
      if (this.meta.runningHeadRight) {
        this.doc.font('body').text(this.meta.runningHeadRight, MARGIN.left + this.contentWidth / 2, headY, { width: this.contentWidth / 2, align: 'right', lineBreak: false })
      }
      this.doc.save().moveTo(MARGIN.left, headY + 13).lineTo(A4.width - MARGIN.right, headY + 13).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
      const footY = A4.height - MARGIN.bottom + 20
      this.doc.save().moveTo(MARGIN.left, footY - 6).lineTo(A4.width - MARGIN.right, footY - 6).lineWidth(0.5).strokeColor(pdfColours.rule).stroke().restore()
      this.doc.font('body').fontSize(8).fillColor(pdfColours.muted)
      if (this.meta.footNote) {
        this.doc.text(fontRuns(this.meta.footNote).map(r => r.text).join(''), MARGIN.left, footY, { width: this.contentWidth - 80, lineBreak: false })
      }
      this.doc.text(`Page ${i - range.start + 1} of ${range.count}`, A4.width - MARGIN.right - 80, footY, { width: 80, align: 'right', lineBreak: false })
      this.doc.page.margins = margins
    }
    this.doc.end()
    return this.done
  }
}

/** A new A4 document in the shipped fonts. Write to it, then `await writer.finish()` for the bytes. */
export async function createPdf(meta: PdfMeta): Promise<PdfWriter> {
  return new PdfWriter(await loadFonts(), meta)
}
