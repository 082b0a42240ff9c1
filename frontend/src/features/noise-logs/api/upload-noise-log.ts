import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NoiseColumnMapping, NoiseMappingPreset } from '@schema/noise-logs';
import { api, ApiError, apiPath, type FieldErrors } from '@frontend/lib/api-client';
import { noiseKeys } from './get-noise-logs';
import type { NoiseLogDetail } from './types';

export interface NoiseUploadInput {
  file: File;
  exposureGroupId: number;
  workerId: number;
  shiftDate: string;
  instrument: string;
  mapping?: NoiseColumnMapping | null;
  presetName?: string;
}

function errorFrom(status: number, text: string): ApiError {
  try {
    const body = JSON.parse(text) as { error?: { code?: string; message?: string; fields?: FieldErrors; details?: unknown } };
    if (body.error?.message) return new ApiError(status, body.error.code ?? 'bad_request', body.error.message, body.error.fields, body.error.details);
  } catch {
    // Not JSON (a proxy's page): fall through to a plain message.
  }
  return new ApiError(status, status === 413 ? 'payload_too_large' : 'internal', `The server answered ${status}.`);
}

/**
 * POST /api/orgs/:orgId/noise-logs as multipart, with XMLHttpRequest so the browser reports upload
 * progress (fetch has no upload progress events). `onProgress` gets 0–1.
 */
export async function uploadNoiseLog(organizationId: string, input: NoiseUploadInput, onProgress: (fraction: number) => void): Promise<NoiseLogDetail> {
  const { csrfToken } = await api.get<{ csrfToken: string }>('/api/auth/csrf');
  const form = new FormData();
  form.set('exposureGroupId', String(input.exposureGroupId));
  form.set('workerId', String(input.workerId));
  form.set('shiftDate', input.shiftDate);
  form.set('instrument', input.instrument);
  if (input.mapping) form.set('mapping', JSON.stringify(input.mapping));
  if (input.presetName) form.set('presetName', input.presetName);
  form.set('file', input.file, input.file.name);
  return new Promise((resolve, reject) => {
    const request = new XMLHttpRequest();
    request.open('POST', `${apiPath('/api/orgs', organizationId)}/noise-logs`);
    request.setRequestHeader('X-CSRF-Token', csrfToken);
    request.setRequestHeader('Accept', 'application/json');
    request.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    request.onload = () => {
      if (request.status >= 200 && request.status < 300) resolve(JSON.parse(request.responseText) as NoiseLogDetail);
      else reject(errorFrom(request.status, request.responseText));
    };
    request.onerror = () => reject(new ApiError(0, 'network', 'Could not reach the Bellwether server. Check your connection and try again.'));
    request.send(form);
  });
}

export function useUploadNoiseLog(organizationId: string, onProgress: (fraction: number) => void) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: NoiseUploadInput) => uploadNoiseLog(organizationId, input, onProgress),
    onSuccess: () => client.invalidateQueries({ queryKey: noiseKeys.all(organizationId) }),
  });
}

export interface NoiseCsvPreview {
  format: 'v1' | 'csv';
  delimiter: string;
  headers: string[];
  rows: string[][];
  presets: NoiseMappingPreset[];
}

/** POST …/noise-logs/preview (data:edit): headers and first rows of a CSV for the mapping step; stores nothing. */
export function previewNoiseCsv(organizationId: string, file: File) {
  const form = new FormData();
  form.set('file', file, file.name);
  return api.upload<NoiseCsvPreview>(`${apiPath('/api/orgs', organizationId)}/noise-logs/preview`, form);
}
