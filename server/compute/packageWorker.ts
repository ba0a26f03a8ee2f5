/**
 * The worker-thread side of the calculation-package pool (server/compute/packagePool.ts):
 * one task is one version's PDF, laid out by server/reports/calculationPackage.ts from the
 * report data the request thread gathered (database reads and the stored results), so the
 * request thread never spends the layout's few hundred milliseconds. Returns the PDF's bytes.
 */
import { calculationPackagePdf } from '../reports/calculationPackage.js';
import type { ReportData } from '../reports/reportData.js';

export default async function packageTask(data: ReportData): Promise<Uint8Array> {
  return calculationPackagePdf(data);
}
