/** Where a thread is shown in the app (a path; prefix the origin for mails). */
export function threadPath(slug: string, thread: { subjectKind: string; subjectId: string; benchmarkId: string | null }): string {
  const w = `/w/${encodeURIComponent(slug)}`;
  if (thread.benchmarkId) {
    const anchor = thread.subjectKind === 'pair' ? `#pair-${encodeURIComponent(thread.subjectId)}` : '#discussion';
    return `${w}/benchmarks/${encodeURIComponent(thread.benchmarkId)}${anchor}`;
  }
  if (thread.subjectKind === 'material') return `${w}/materials/${encodeURIComponent(thread.subjectId)}#discussion`;
  if (thread.subjectKind === 'calculation-set') return `${w}/materials/${encodeURIComponent(thread.subjectId.split('|')[0])}#discussion`;
  return `${w}/minutes`;
}
