import { z } from 'zod'
import { TA_ACIDS, TA_UNITS, TANNIN_UNITS } from '../types/lot'
import { DATE_FORMATS } from '../utils/labImport'

// The import of a lab sheet: which header holds which reading, and how the sheet writes its dates
// and numbers. A column left out is not read; lot code and sampling day are always needed.

const header = z.string({ message: 'Choose one of the sheet\'s columns' }).min(1, { message: 'Choose one of the sheet\'s columns' }).max(300)
const optionalHeader = header.optional()

export const columnMappingSchema = z.strictObject({
  lotCode: header,
  sampledOn: header,
  brix: optionalHeader,
  sg: optionalHeader,
  tempC: optionalHeader,
  ta: optionalHeader,
  ph: optionalHeader,
  tannin: optionalHeader,
  yan: optionalHeader,
  taAs: z.enum(TA_ACIDS, { message: 'Choose malic, tartaric or sulfuric' }).default('malic'),
  taUnit: z.enum(TA_UNITS, { message: 'Choose g/L or % w/v' }).default('g/L'),
  tanninUnit: z.enum(TANNIN_UNITS, { message: 'Choose g/L, % or mg/L' }).default('g/L'),
})

export const labImportSchema = z.strictObject({
  mapping: columnMappingSchema,
  dateFormat: z.enum(DATE_FORMATS, { message: 'Choose YYYY-MM-DD, DD/MM/YYYY or MM/DD/YYYY' }).default('YYYY-MM-DD'),
  decimalComma: z.boolean({ message: 'Say yes or no' }).default(false),
  skipBadRows: z.boolean({ message: 'Say yes or no' }).default(false),
})
export type LabImportInput = z.output<typeof labImportSchema>
