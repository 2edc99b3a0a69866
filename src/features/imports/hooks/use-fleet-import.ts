import { useState } from 'react';
import type { ImportMapping, UnitImportDto } from '../../../../shared/schemas/imports';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import type { TransferProgress } from '../../../lib/transfer';
import { useCommitImport, useImportProgress, usePreviewImport } from '../api/fleet-import';

/**
 * The import's steps: a file is checked as soon as it is chosen (again with a new column mapping), then committed
 * under one import key, its progress polled while the request runs.
 */
export function useFleetImport() {
  const [file, setFile] = useState<File | null>(null);
  const [skipExisting, setSkipExisting] = useState(false);
  const [upload, setUpload] = useState<TransferProgress | null>(null);
  const [importKey, setImportKey] = useState<string | null>(null);
  const [done, setDone] = useState<UnitImportDto | null>(null);
  const preview = usePreviewImport();
  const commit = useCommitImport();
  const progress = useImportProgress(commit.isPending ? importKey : null);

  const check = (f: File, mapping?: ImportMapping) => {
    setDone(null);
    commit.reset();
    setUpload(null);
    preview.mutate({ file: f, mapping, onProgress: setUpload });
  };

  const choose = (f: File | undefined) => {
    if (!f) return;
    setFile(f);
    setSkipExisting(false);
    check(f);
  };

  const p = preview.data;
  const blocked = !p || p.errorCount > 0 || (p.existingCount > 0 && !skipExisting) || p.readyCount === 0;

  const startImport = () => {
    if (!file || !p) return;
    const key = newIdempotencyKey();
    setImportKey(key);
    setUpload(null);
    commit.mutate(
      { file, mapping: p.mapping, importKey: key, skipExisting, onProgress: setUpload },
      { onSuccess: (result) => setDone(result) },
    );
  };

  const startOver = () => {
    setDone(null);
    setFile(null);
    preview.reset();
  };

  return {
    file,
    skipExisting,
    setSkipExisting,
    upload,
    done,
    preview,
    commit,
    server: progress.data,
    blocked,
    check,
    choose,
    startImport,
    startOver,
  };
}

export type FleetImportState = ReturnType<typeof useFleetImport>;
