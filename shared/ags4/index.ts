/** AGS4 reader, checker, writer and the mapping to Pastload's investigation model, in one import. */
export type { AgsFile, AgsGroup, AgsIssue, AgsRow, AgsSeverity, AgsValue, AgsWritableGroup } from './types'
export { decodeAgs, parseAgs, tokenizeAgsLine } from './parse'
export type { LineProblem, TokenizedLine } from './parse'
export { checkAgs, readTransferSettings, sortIssues } from './check'
export type { CheckOptions, TransferSettings } from './check'
export {
  dictionaryFromAgs,
  keyHeadings,
  PASTLOAD_GROUPS,
  parseStatus,
  renderStandardGroups,
  standardDictionary,
  withFileDefinitions,
} from './dictionary'
export type { AgsDefinitionSource, AgsDictionary, AgsGroupDefinition, AgsHeadingDefinition } from './dictionary'
export { checkValue, formatNumber, isAgsNumber } from './datatypes'
export { collectUsedDefinitions, formatValue, quoteField, writableGroup, writeAgs } from './write'
export { agsToInvestigation, investigationToAgs, investigationToAgsGroups } from './investigation'
export type { AgsExportOptions, AgsImportOptions, AgsImportResult } from './investigation'
