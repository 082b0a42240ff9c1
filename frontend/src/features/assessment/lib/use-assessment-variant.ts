import { useCallback, useEffect, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router';
import { priorNames, type PriorName } from '@schema/assessment';
import type { AssessmentVariant } from '../api/get-assessment';

/** Read `?exclude=3,17`: positive whole numbers, sorted, without repeats; anything else is ignored. */
export function parseExcludeParam(text: string | null): number[] {
  if (!text) return [];
  const ids = text
    .split(',')
    .map((part) => part.trim())
    .filter((part) => /^\d+$/.test(part))
    .map(Number)
    .filter((id) => id > 0);
  return [...new Set(ids)].sort((a, b) => a - b);
}

function sameVariant(a: AssessmentVariant, b: AssessmentVariant): boolean {
  return a.prior === b.prior && a.exclude.length === b.exclude.length && a.exclude.every((id, index) => id === b.exclude[index]);
}

function parsePrior(text: string | null): PriorName {
  return priorNames.find((name) => name === text) ?? 'reference';
}

/**
 * The assessment's what-if state, kept in the address (`?exclude=1,2&prior=gsd-informative`) so it
 * survives a reload, can be shared, and can be read by the decision draft, which saves the
 * exclusions with the record. Stored results never change.
 */
export function useAssessmentVariant() {
  const [search, setSearch] = useSearchParams();
  const excludeText = search.get('exclude');
  const priorText = search.get('prior');
  const fromAddress: AssessmentVariant = useMemo(() => ({ exclude: parseExcludeParam(excludeText), prior: parsePrior(priorText) }), [excludeText, priorText]);
  // The address changes through a navigation, which completes a moment later; the page shows the choice at once.
  const [pending, setPending] = useState<AssessmentVariant | null>(null);
  const variant = pending ?? fromAddress;
  useEffect(() => {
    if (pending && sameVariant(pending, fromAddress)) setPending(null);
  }, [pending, fromAddress]);

  const update = useCallback(
    (next: AssessmentVariant) => {
      setPending({ exclude: [...next.exclude].sort((a, b) => a - b), prior: next.prior });
      setSearch(
        (current) => {
          const params = new URLSearchParams(current);
          if (next.exclude.length > 0) params.set('exclude', [...next.exclude].sort((a, b) => a - b).join(','));
          else params.delete('exclude');
          if (next.prior !== 'reference') params.set('prior', next.prior);
          else params.delete('prior');
          return params;
        },
        { replace: true, preventScrollReset: true },
      );
    },
    [setSearch],
  );

  return {
    variant,
    /** The results left out now: what a decision draft saves with the record. */
    excluded: variant.exclude,
    setLeftOut(id: number, leftOut: boolean) {
      const ids = new Set(variant.exclude);
      if (leftOut) ids.add(id);
      else ids.delete(id);
      update({ ...variant, exclude: [...ids] });
    },
    clearExclusions() {
      update({ ...variant, exclude: [] });
    },
    setPrior(prior: PriorName) {
      update({ ...variant, prior });
    },
  };
}
