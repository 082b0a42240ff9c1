import type { SamplingGuidance as Guidance } from '@frontend/lib/api-types';

/** Why a plan asks for 6 shifts (EN 689 and the trade's 6–10), with its sources, as the API words it. */
export function SamplingGuidance({ guidance, id }: { guidance: Guidance; id?: string }) {
  return (
    <div id={id} className="rounded border border-primary-200 bg-primary-50 px-3 py-2 text-sm text-primary-900">
      <p>{guidance.text}</p>
      <details className="mt-1">
        <summary className="cursor-pointer text-xs font-medium text-primary-800">Sources</summary>
        <ul className="mt-1 list-disc space-y-0.5 pl-5 text-xs">
          {guidance.sources.map((source) => (
            <li key={source.citation}>
              {source.citation}
              {source.status === 'from memory' && <span className="text-primary-700"> (cited from memory)</span>}
            </li>
          ))}
        </ul>
      </details>
    </div>
  );
}
