import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'

/** All the text of a PDF as pdf.js reads it, whitespace collapsed, with its page count. */
export async function pdfText(bytes: Uint8Array): Promise<{ pages: number, text: string }> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false }).promise
  let text = ''
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent()
    text += `${content.items.map(item => ('str' in item ? item.str : '')).join(' ')}\n`
  }
  return { pages: doc.numPages, text: text.replace(/\s+/g, ' ') }
}
