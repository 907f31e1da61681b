import PDFDocument from 'pdfkit'

/** A small real PDF with the given text on its one page. */
export function makePdf(text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4' })
    const chunks: Buffer[] = []
    doc.on('data', c => chunks.push(c as Buffer))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
    doc.fontSize(20).text(text, 72, 72)
    doc.rect(72, 140, 300, 150).stroke()
    doc.end()
  })
}

/** A valid 1 × 1 PNG. */
export const tinyPng = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64')

/** The first bytes of a Windows executable, the classic disguise. */
export const fakeExe = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(510, 0x90)])

export const dxfText = '  0\nSECTION\n  2\nHEADER\n  0\nENDSEC\n  0\nEOF\n'
export const ifcText = 'ISO-10303-21;\nHEADER;\nFILE_DESCRIPTION((\'ViewDefinition\'),\'2;1\');\nENDSEC;\nDATA;\nENDSEC;\nEND-ISO-10303-21;\n'
