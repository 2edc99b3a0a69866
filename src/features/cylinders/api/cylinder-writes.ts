import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  CylinderDetailDto,
  CylinderImportResultDto,
  CylinderStatus,
  QuarantineResultDto,
} from '../../../../shared/schemas/cylinders';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';
import { uploadForm, type TransferProgress } from '../../../lib/transfer';
import { cylinderKeys } from './keys';

export type CreateCylinderBody = {
  code?: string;
  kind: 'new' | 'recovery';
  refrigerant: string;
  tareKg: number;
  capacityKg: number;
  grossKg?: number;
  gasOrigin?: string;
  supplier?: string;
  lot?: string;
  siteId?: number | null;
};

export function useCreateCylinder() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateCylinderBody) => apiClient.post<CylinderDetailDto>('/api/cylinders', body),
    onSuccess: () => qc.invalidateQueries({ queryKey: cylinderKeys.all }),
  });
}

export function useRecordWeighing(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { grossKg: number; note?: string }) =>
      apiClient.post<CylinderDetailDto>(`/api/cylinders/${id}/weighings`, body),
    onSuccess: (data) => {
      qc.setQueryData(cylinderKeys.detail(id), data);
      void qc.invalidateQueries({ queryKey: cylinderKeys.all });
    },
  });
}

export function useChangeCylinderStatus(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { status: CylinderStatus; reason?: string }) =>
      apiClient.post<QuarantineResultDto>(`/api/cylinders/${id}/status`, body),
    onSuccess: (data) => {
      void qc.invalidateQueries({ queryKey: cylinderKeys.all });
      // Quarantine marks units: their histories show the note.
      if (data.unitsMarked) void qc.invalidateQueries({ queryKey: queryRoots.history });
    },
  });
}

export function useImportCylinders() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress?: (p: TransferProgress) => void }) => {
      const form = new FormData();
      form.append('file', file);
      return uploadForm<CylinderImportResultDto>('/api/cylinder-imports', form, onProgress);
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: cylinderKeys.all }),
  });
}
