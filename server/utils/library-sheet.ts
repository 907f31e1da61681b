import type { H3Event } from 'h3'
import { itemStatusLabels, junctionTypeLabels, libraryCollectionLabels } from '../../shared/library/terms'

/**
 * The library's printable sheet of one item: title block, drawing, key values, body, revision history,
 * related items and the caution, laid out with the PDF engine in server/utils/pdf.ts.
 */

const drawingName = /^[A-Za-z0-9-]+\.svg$/

/** An item's SVG drawing, read from the site's public files (the name is checked, never a path). */
export async function readLibraryDrawing(file: string): Promise<string> {
  if (!drawingName.test(file)) throw createError({ statusCode: 404, statusMessage: 'No such drawing' })
  try {
    return await $fetch<string>(`/library/drawings/${file}`, { responseType: 'text' })
  }
  catch {
    throw createError({ statusCode: 404, statusMessage: 'No such drawing' })
  }
}

function viewBoxOf(svg: string): { width: number, height: number } {
  const m = /viewBox="\s*[-\d.]+[\s,]+[-\d.]+[\s,]+([\d.]+)[\s,]+([\d.]+)\s*"/.exec(svg)
  if (!m) return { width: 840, height: 594 }
  return { width: Number(m[1]), height: Number(m[2]) }
}

const longDate = new Intl.DateTimeFormat('en-IE', { dateStyle: 'long', timeZone: 'UTC' })
const dateOf = (iso: string) => longDate.format(new Date(`${iso}T00:00:00Z`))

export const sheetCaution = 'This sheet shows a typical arrangement for the demonstration system. A competent designer confirms '
  + 'the design of each project under its local regulations, and a chartered engineer confirms anything structural, '
  + 'fire-related or affected by wind load. It is not a compliance certificate. All data in this library is invented demo data.'

/** The PDF sheet of an item, as bytes. */
export async function renderLibrarySheet(event: H3Event, item: LibraryItemView): Promise<Buffer> {
  const pdf = await createPdf({
    title: `${item.code} ${item.title}`,
    subject: `${libraryCollectionLabels[item.collection]} — revision ${item.revision}`,
    runningHead: `Corrstone Building Systems Ltd — detail library — ${item.code} rev ${item.revision}`,
    runningHeadRight: 'Demo data: invented',
    footNote: `${item.code} rev ${item.revision}, ${item.revisionDate}. Printed ${new Date().toISOString().slice(0, 10)}. Check the library for the current revision.`,
  })
  await drawLibrarySheet(event, pdf, item)
  return pdf.finish()
}

/** Draws an item's sheet at the cursor of a PDF being written (its own file, or a page of a response pack). */
export async function drawLibrarySheet(event: H3Event, pdf: PdfWriter, item: LibraryItemView): Promise<void> {
  // Title block: code and title on a tinted panel, the sheet's particulars beside them.
  const doc = pdf.doc
  const top = doc.y
  const panelHeight = 78
  doc.save().rect(pdf.left, top, pdf.contentWidth, panelHeight).fill(pdfColours.panel).restore()
  const leftWidth = pdf.contentWidth * 0.62
  doc.y = top + 10
  pdf.text(item.code, { size: 20, bold: true, color: pdfColours.clay, width: leftWidth - 12 }, pdf.left + 12)
  pdf.text(item.title, { size: 12.5, bold: true, width: leftWidth - 12 }, pdf.left + 12)
  const particulars: Array<[string, string]> = [
    ['Revision', item.revision],
    ['Date', dateOf(item.revisionDate)],
    ['Status', itemStatusLabels[item.status]],
    [item.junctionType ? 'Junction' : 'Kind', item.junctionType ? junctionTypeLabels[item.junctionType] : libraryCollectionLabels[item.collection]],
  ]
  const rightX = pdf.left + leftWidth
  particulars.forEach(([label, value], i) => {
    doc.y = top + 10 + i * 15
    pdf.text(label, { size: 8.5, bold: true, color: pdfColours.muted, width: 60 }, rightX)
    doc.y = top + 10 + i * 15
    pdf.text(value, { size: 9.5, width: pdf.contentWidth - leftWidth - 72 }, rightX + 62)
  })
  doc.y = top + panelHeight + 12

  if (item.status === 'superseded') {
    const successor = item.successor ? `${item.successor.code} (${item.successor.title})` : (item.supersededBy ?? 'a later item')
    pdf.caution(`This item is superseded by ${successor}. Use the successor for new work; this sheet is kept for the record.`, 'Superseded')
  }

  pdf.paragraph(item.summary, { size: 10.5, color: pdfColours.muted, gap: 8 })

  if (item.drawing) {
    const svg = await readLibraryDrawing(item.drawing)
    const box = viewBoxOf(svg)
    pdf.svg(svg, { viewWidth: box.width, viewHeight: box.height, maxHeight: 360, frame: true })
  }

  if (item.collection === 'details') {
    pdf.heading('Key values')
    const rows: Array<[string, string]> = []
    if (item.wallBuildUp) rows.push(['Wall build-up', item.wallBuildUp])
    if (item.psi !== null) rows.push(['Linear thermal transmittance ψ', `${item.psi.toFixed(3)} W/mK (invented demo value)`])
    if (item.fRsi !== null) rows.push(['Temperature factor fRsi', `${item.fRsi.toFixed(2)} (invented demo value)`])
    pdf.keyValues(rows, { note: item.modelledValuesNote ?? 'Invented demo values.' })
  }

  let first = true
  for (const block of await getLibraryBlocks(event, item.code)) {
    if (block.kind === 'heading') pdf.heading(block.text, 2)
    else {
      if (first) pdf.heading('Notes', 2)
      if (block.kind === 'item') pdf.listItem(block.text, block.number ? `${block.number}.` : '•')
      else if (block.kind === 'quote') pdf.paragraph(block.text, { indent: 12, color: pdfColours.muted })
      else pdf.paragraph(block.text)
    }
    first = false
  }

  pdf.heading('Revision history')
  pdf.keyValues(item.revisions.map(r => [`${r.revision} — ${dateOf(r.date)}`, r.note]), { labelWidth: 130 })

  if (item.related.length) {
    pdf.heading('Related items')
    for (const r of item.related) pdf.listItem(`${r.code} rev ${r.revision} — ${r.title}${r.status === 'superseded' ? ' (superseded)' : ''}`)
  }

  doc.y += 6
  pdf.caution(sheetCaution, 'Caution')
}
