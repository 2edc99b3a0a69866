import { useMutation } from '@tanstack/react-query';
import { saveFile } from '../../../lib/transfer';

/** The A4 label sheet for the chosen units, saved as a PDF. */
export function printLabelSheet(unitIds: number[]): Promise<void> {
  return saveFile('/api/labels', `tightloop-labels-${unitIds.length}.pdf`, { method: 'POST', body: { unitIds } });
}

export function usePrintLabelSheet() {
  return useMutation({ mutationFn: printLabelSheet });
}

/** Opened in a new tab by the browser's own PDF viewer; `sheet` puts the one label on an A4 label sheet. */
export function singleLabelHref(unitId: number, layout: 'single' | 'sheet' = 'single'): string {
  return `/api/units/${unitId}/label${layout === 'sheet' ? '?layout=sheet' : ''}`;
}
