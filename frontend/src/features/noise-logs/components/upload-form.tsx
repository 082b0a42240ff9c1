import { useState, type FormEvent } from 'react';
import { noiseLogMaximumBytes, type NoiseColumnMapping } from '@schema/noise-logs';
import { Button } from '@frontend/components/button';
import { SelectField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { previewNoiseCsv, useUploadNoiseLog, type NoiseCsvPreview } from '../api/upload-noise-log';
import type { NoiseLogDetail } from '../api/types';

type Choice = { value: string; label: string };

const emptyMapping = (): Record<string, string> => ({
  time: '',
  timeUnit: 's',
  level: '',
  peak: '',
  accelerationX: '',
  accelerationY: '',
  accelerationZ: '',
  accelerationPeak: '',
  accelerationUnit: 'mg',
  moving: '',
  intervalSeconds: '1',
  presetName: '',
});

/**
 * Upload a noise log: our format version 1 goes straight in; any other CSV gets a column-mapping
 * step (time, level, peak, acceleration and motion columns, units and interval) that can be saved
 * as a named preset. The upload shows a progress bar (XMLHttpRequest upload events).
 */
export function NoiseUploadForm({
  organizationId,
  groups,
  workers,
  onUploaded,
}: {
  organizationId: string;
  groups: Choice[];
  workers: Choice[];
  onUploaded: (log: NoiseLogDetail) => void;
}) {
  const [progress, setProgress] = useState<number | null>(null);
  const upload = useUploadNoiseLog(organizationId, setProgress);
  const [file, setFile] = useState<File | null>(null);
  const [groupId, setGroupId] = useState('');
  const [workerId, setWorkerId] = useState('');
  const [shiftDate, setShiftDate] = useState('');
  const [instrument, setInstrument] = useState('');
  const [preview, setPreview] = useState<NoiseCsvPreview | null>(null);
  const [mapping, setMapping] = useState(emptyMapping);
  const [problems, setProblems] = useState<Record<string, string>>({});

  async function choose(next: File | null) {
    setFile(next);
    setPreview(null);
    setProblems({});
    upload.reset();
    if (!next) return;
    if (next.size > noiseLogMaximumBytes) {
      setProblems({ file: `The file is ${(next.size / 1024 / 1024).toFixed(1)} MB, over the 50 MB limit for a noise log` });
      return;
    }
    const head = await next.slice(0, 256).text();
    if (/^\ufeff?\s*#\s*noise-log\s*:/i.test(head)) return;
    try {
      const answer = await previewNoiseCsv(organizationId, next);
      setPreview(answer);
      const headers = answer.headers;
      const guess = (pattern: RegExp) => headers.find((header) => pattern.test(header)) ?? '';
      setMapping({ ...emptyMapping(), time: guess(/time|^t/i), level: guess(/laeq|leq|level/i), peak: guess(/peak/i) });
    } catch (failure) {
      setProblems({ file: isApiError(failure) ? failure.message : 'The file could not be read' });
    }
  }

  function mappingValue(): NoiseColumnMapping | null {
    if (!preview || preview.format === 'v1') return null;
    const column = (key: string) => mapping[key] || null;
    return {
      time: mapping.time,
      timeUnit: mapping.timeUnit as NoiseColumnMapping['timeUnit'],
      level: mapping.level,
      peak: column('peak'),
      accelerationX: column('accelerationX'),
      accelerationY: column('accelerationY'),
      accelerationZ: column('accelerationZ'),
      accelerationPeak: column('accelerationPeak'),
      accelerationUnit: mapping.accelerationUnit as NoiseColumnMapping['accelerationUnit'],
      moving: column('moving'),
      intervalSeconds: Number(mapping.intervalSeconds),
    };
  }

  async function submit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    if (!file) found.file = 'Choose the noise log file';
    if (!groupId) found.exposureGroupId = 'Pick the exposure group';
    if (!workerId) found.workerId = 'Pick the worker';
    if (!/^\d{4}-\d{2}-\d{2}$/.test(shiftDate)) found.shiftDate = 'Give the shift date';
    if (preview?.format === 'csv') {
      if (!mapping.time) found.time = 'Pick the time column';
      if (!mapping.level) found.level = 'Pick the level column';
      const interval = Number(mapping.intervalSeconds);
      if (!(interval >= 0.125 && interval <= 60)) found.intervalSeconds = 'The interval is 0.125–60 s';
    }
    setProblems(found);
    if (Object.keys(found).length || !file) return;
    setProgress(0);
    try {
      const log = await upload.mutateAsync({
        file,
        exposureGroupId: Number(groupId),
        workerId: Number(workerId),
        shiftDate,
        instrument,
        mapping: mappingValue(),
        presetName: mapping.presetName || undefined,
      });
      onUploaded(log);
    } catch (failure) {
      if (isApiError(failure) && failure.fields) setProblems(failure.fields);
    }
  }

  const columnChoices = [{ value: '', label: '— none —' }, ...(preview?.headers ?? []).map((header) => ({ value: header, label: header }))];
  const mapSelect = (key: string, label: string, required = false) => (
    <SelectField
      label={label}
      value={mapping[key]}
      onChange={(event) => setMapping({ ...mapping, [key]: event.target.value })}
      options={required ? [{ value: '', label: 'Pick a column' }, ...columnChoices.slice(1)] : columnChoices}
      error={problems[key]}
    />
  );

  return (
    <form onSubmit={submit} className="space-y-4" noValidate aria-label="Upload a noise log">
      {upload.error && (
        <Notice tone="error" title="The log was not stored">
          {isApiError(upload.error) ? upload.error.message : 'The upload failed.'}
        </Notice>
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        <div className="space-y-1">
          <label htmlFor="noise-file" className="block text-sm font-medium text-slate-800">
            Noise log file (.csv, at most 50 MB)
          </label>
          <input
            id="noise-file"
            type="file"
            accept=".csv,.txt,text/csv"
            className="block text-sm"
            onChange={(event) => void choose(event.target.files?.[0] ?? null)}
            aria-describedby="noise-file-hint"
          />
          <p id="noise-file-hint" className="text-xs text-slate-600">
            Our noise log format version 1 is read as it is; any other CSV asks which column holds what.
          </p>
          {problems.file && <p className="text-xs font-medium text-red-800">{problems.file}</p>}
        </div>
        <TextField label="Instrument" value={instrument} onChange={(event) => setInstrument(event.target.value)} hint="Blank: taken from the file" />
        <SelectField
          label="Exposure group"
          value={groupId}
          onChange={(event) => setGroupId(event.target.value)}
          options={[{ value: '', label: 'Pick a noise group' }, ...groups]}
          error={problems.exposureGroupId}
        />
        <SelectField
          label="Worker"
          value={workerId}
          onChange={(event) => setWorkerId(event.target.value)}
          options={[{ value: '', label: 'Pick a worker' }, ...workers]}
          error={problems.workerId}
        />
        <TextField label="Shift date" type="date" value={shiftDate} onChange={(event) => setShiftDate(event.target.value)} error={problems.shiftDate} />
      </div>

      {preview?.format === 'csv' && (
        <fieldset className="space-y-3 rounded-md border border-slate-200 p-3">
          <legend className="px-1 text-sm font-semibold">Which column holds what</legend>
          {preview.presets.length > 0 && (
            <SelectField
              label="Saved mapping"
              value=""
              onChange={(event) => {
                const preset = preview.presets.find((entry) => String(entry.id) === event.target.value);
                if (!preset) return;
                const saved = preset.mapping;
                setMapping({
                  ...emptyMapping(),
                  time: saved.time,
                  timeUnit: saved.timeUnit,
                  level: saved.level,
                  peak: saved.peak ?? '',
                  accelerationX: saved.accelerationX ?? '',
                  accelerationY: saved.accelerationY ?? '',
                  accelerationZ: saved.accelerationZ ?? '',
                  accelerationPeak: saved.accelerationPeak ?? '',
                  accelerationUnit: saved.accelerationUnit,
                  moving: saved.moving ?? '',
                  intervalSeconds: String(saved.intervalSeconds),
                });
              }}
              options={[{ value: '', label: 'Use a saved mapping…' }, ...preview.presets.map((preset) => ({ value: String(preset.id), label: preset.name }))]}
            />
          )}
          <div className="grid gap-3 sm:grid-cols-3">
            {mapSelect('time', 'Time column', true)}
            <SelectField
              label="Time unit"
              value={mapping.timeUnit}
              onChange={(event) => setMapping({ ...mapping, timeUnit: event.target.value })}
              options={[
                { value: 's', label: 'seconds' },
                { value: 'ms', label: 'milliseconds' },
                { value: 'min', label: 'minutes' },
              ]}
            />
            <TextField
              label="Interval, s"
              inputMode="decimal"
              value={mapping.intervalSeconds}
              onChange={(event) => setMapping({ ...mapping, intervalSeconds: event.target.value })}
              error={problems.intervalSeconds}
            />
            {mapSelect('level', 'A-weighted level (LAeq), dB', true)}
            {mapSelect('peak', 'C-weighted peak, dB')}
            {mapSelect('moving', 'Motion flag (0/1)')}
            {mapSelect('accelerationX', 'Acceleration x')}
            {mapSelect('accelerationY', 'Acceleration y')}
            {mapSelect('accelerationZ', 'Acceleration z')}
            {mapSelect('accelerationPeak', 'Peak acceleration')}
            <SelectField
              label="Acceleration unit"
              value={mapping.accelerationUnit}
              onChange={(event) => setMapping({ ...mapping, accelerationUnit: event.target.value })}
              options={[
                { value: 'mg', label: 'milli-g' },
                { value: 'g', label: 'g' },
              ]}
            />
            <TextField
              label="Save this mapping as"
              value={mapping.presetName}
              onChange={(event) => setMapping({ ...mapping, presetName: event.target.value })}
              hint="Optional name of a preset"
            />
          </div>
          <div className="overflow-x-auto">
            <table className="text-xs" aria-label="First rows of the file">
              <thead>
                <tr>
                  {preview.headers.map((header) => (
                    <th key={header} scope="col" className="border-b border-slate-300 px-2 py-1 text-left">
                      {header}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {preview.rows.slice(0, 5).map((row, index) => (
                  <tr key={index}>
                    {row.map((cell, column) => (
                      <td key={column} className="px-2 py-0.5 tabular-nums">
                        {cell}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </fieldset>
      )}

      {progress !== null && upload.isPending && (
        <div>
          <label htmlFor="noise-upload-progress" className="text-sm">
            Uploading… {Math.round(progress * 100)} %
          </label>
          <progress id="noise-upload-progress" className="block h-2 w-full" max={1} value={progress} />
        </div>
      )}
      <Button type="submit" variant="primary" pending={upload.isPending}>
        Upload and check
      </Button>
    </form>
  );
}
