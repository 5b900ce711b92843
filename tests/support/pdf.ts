// The text of a PDF, read back with pdf-parse (a PDF library independent of the one that wrote it).
import { PDFParse } from 'pdf-parse'

export async function pdfText(bytes: Uint8Array): Promise<string> {
  const parser = new PDFParse({ data: bytes })
  try {
    return (await parser.getText()).text
  } finally {
    await parser.destroy()
  }
}
