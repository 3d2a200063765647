import { it } from 'vitest'
import { writeFileSync } from 'node:fs'
import { renderReport } from '~~/server/services/reports/render'
import { modelVersionDocument } from '#shared/reports/model-version'
import { pdfPageToPng } from '../../helpers/pdf'
import { reportData } from './model-version-fixture'
it('try', async () => {
  const t = Date.now()
  const { pdf, pages } = await renderReport(modelVersionDocument(reportData()))
  console.log('pages', pages, Date.now() - t, 'ms')
  writeFileSync('/tmp/mv.pdf', pdf)
  pdfPageToPng(pdf, 'try-mv-p1', 1)
  pdfPageToPng(pdf, 'try-mv-p2', 2)
  pdfPageToPng(pdf, 'try-mv-p4', 4)
}, 60000)
