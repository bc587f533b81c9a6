// How a list's count reads. Lists count up to a cap (COUNT_CAP in lib/api/keyset.ts) and then say the
// figure is a lower bound (`totalIsLowerBound`), which reads "at least 1,000 recordings".
export type CountedList = { total: number; totalIsLowerBound?: boolean };

export function countPhrase(list: CountedList, one: string, many: string): string {
  const n = list.total.toLocaleString("en-US");
  return list.totalIsLowerBound ? `at least ${n} ${many}` : `${n} ${list.total === 1 ? one : many}`;
}
