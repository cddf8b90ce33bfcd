import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HerdImportDto, HerdImportProgressDto } from '@burrowline/shared';
import { uploadForm } from '../../../lib/upload';
import { herdFileKeys } from './herd-file-keys';

export interface StageCallbacks {
  onUpload?: (sent: number, total: number) => void;
  onProgress?: (progress: HerdImportProgressDto) => void;
}

/** Uploads a spreadsheet and hears the server check it, line by line of a streamed answer. */
export function stageHerdImport(file: File, { onUpload, onProgress }: StageCallbacks = {}): Promise<HerdImportDto> {
  const form = new FormData();
  form.append('file', file);
  return uploadForm<HerdImportDto>('/api/herd-imports', form, {
    onUpload,
    onLine: (line) => onProgress?.(line as HerdImportProgressDto),
  });
}

export function useStageHerdImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, ...callbacks }: StageCallbacks & { file: File }) => stageHerdImport(file, callbacks),
    onSuccess: (preview) => queryClient.setQueryData(herdFileKeys.import(preview.id, { show: 'all', page: 1, pageSize: 100 }), preview),
  });
}
