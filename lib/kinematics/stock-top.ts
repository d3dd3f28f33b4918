// Z of the stock top in the work frame, from where the job puts Z zero (common practice: CAM
// programs zero either on the top of the sheet or on the table/spoilboard surface).
export type ZeroAt = 'top' | 'table';

/** 0 when zero is the stock top; the sheet thickness when zero is the table; 0 without a sheet. */
export function stockTopZ(zero: ZeroAt, sheetThicknessMm: number | null | undefined): number {
  if (zero === 'table' && sheetThicknessMm != null && sheetThicknessMm > 0) return sheetThicknessMm;
  return 0;
}
