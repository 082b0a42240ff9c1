/**
 * Large lab files for the crash-consistency test and the lab-import benchmark: single full-shift
 * samples, one row per worker-day, the workers taking turns day by day from 2016-01-01, results
 * 0.05–1.01 mg/m³ in a repeating pattern. Invented data for load, not for checking figures.
 */

/** The columns of `singleSampleLabFile`, mapped as a commit expects them. */
export const singleSampleCommit = {
  mapping: {
    workerCode: 'Worker',
    date: 'Date',
    group: 'Group',
    agent: 'Analyte',
    value: 'Result',
    unit: 'Units',
    sampleId: 'Sample ID',
    lab: 'Lab',
    detectionLimit: null,
    startTime: null,
    endTime: null,
    minutes: null,
  },
};

/** The CSV text of `rows` samples for one group and agent; sample ids are `${samplePrefix}-${row}`. */
export function singleSampleLabFile(input: {
  workerCodes: readonly string[];
  groupName: string;
  agentName: string;
  rows: number;
  samplePrefix: string;
  lab: string;
}): string {
  const lines = ['Worker,Date,Group,Analyte,Result,Units,Sample ID,Lab'];
  const first = Date.UTC(2016, 0, 1);
  const perDay = input.workerCodes.length;
  for (let row = 0; row < input.rows; row += 1) {
    const date = new Date(first + Math.floor(row / perDay) * 86_400_000).toISOString().slice(0, 10);
    const value = (0.05 + (row % 97) / 100).toFixed(2);
    lines.push(`${input.workerCodes[row % perDay]},${date},${input.groupName},${input.agentName},${value},mg/m3,${input.samplePrefix}-${row},${input.lab}`);
  }
  return lines.join('\n');
}
