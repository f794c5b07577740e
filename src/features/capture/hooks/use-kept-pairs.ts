import { useCallback, useState } from 'react';

/**
 * Near-duplicate pairs a person on this tablet confirmed as two real events ("keep both"), kept in
 * localStorage per case so a reload does not ask again. Voiding one of a pair needs no memory: the
 * void is in the log and the pair is gone from every tablet.
 */
const key = (caseId: string) => `ledgerline.nearDuplicates.kept.${caseId}`;

function read(caseId: string): Set<string> {
  try {
    const v: unknown = JSON.parse(localStorage.getItem(key(caseId)) ?? '[]');
    return new Set(Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : []);
  } catch {
    return new Set();
  }
}

export function useKeptPairs(caseId: string): [ReadonlySet<string>, (pairKey: string) => void] {
  const [kept, setKept] = useState(() => read(caseId));
  const keep = useCallback((pairKey: string) => {
    setKept((prev) => {
      const next = new Set(prev).add(pairKey);
      localStorage.setItem(key(caseId), JSON.stringify([...next]));
      return next;
    });
  }, [caseId]);
  return [kept, keep];
}
