// A one-page PDF of plain text, as a small lab sends its results: a title, some lines, and a
// table written as lines. Helvetica and Courier are among the fonts every PDF reader has, so
// nothing is embedded; text is written in WinAnsi (Latin-1 covers "°" and "£"). For the demo's and the tests'
// PDF sheets only.

/** A line of text; `mono` sets it in Courier, so a table written with spaces keeps its columns. */
export interface CertificateLine { text: string, bold?: boolean, mono?: boolean, size?: number, gapBefore?: number }

function pdfString(text: string): string {
  return `(${text.replace(/[\\()]/g, c => `\\${c}`)})`
}

export function textPdf(lines: CertificateLine[]): Uint8Array {
  let y = 790
  const content = lines.map((line) => {
    const size = line.size ?? 11
    y -= (line.gapBefore ?? 0) + size * 1.45
    return `BT /${line.mono ? (line.bold ? 'F4' : 'F3') : line.bold ? 'F2' : 'F1'} ${size} Tf 56 ${y.toFixed(1)} Td ${pdfString(line.text)} Tj ET`
  }).join('\n')
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 4 0 R /F2 5 0 R /F3 6 0 R /F4 7 0 R >> >> /Contents 8 0 R >>',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica /Encoding /WinAnsiEncoding >>',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica-Bold /Encoding /WinAnsiEncoding >>',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Courier /Encoding /WinAnsiEncoding >>',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Courier-Bold /Encoding /WinAnsiEncoding >>',
    `<< /Length ${Buffer.byteLength(content, 'latin1')} >>\nstream\n${content}\nendstream`,
  ]
  let body = '%PDF-1.4\n'
  const offsets: number[] = []
  objects.forEach((object, i) => {
    offsets.push(Buffer.byteLength(body, 'latin1'))
    body += `${i + 1} 0 obj\n${object}\nendobj\n`
  })
  const xref = Buffer.byteLength(body, 'latin1')
  body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map(o => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`
  return new Uint8Array(Buffer.from(body, 'latin1'))
}
