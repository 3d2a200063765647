/** The TrueType files of Source Sans 3 (package `source-sans`, folder `TTF/`) that reports embed, by pdfmake style. */
export const REPORT_FONT_FILES = {
  normal: 'SourceSans3-Regular.ttf',
  bold: 'SourceSans3-Semibold.ttf',
  italics: 'SourceSans3-It.ttf',
  bolditalics: 'SourceSans3-SemiboldIt.ttf',
} as const
