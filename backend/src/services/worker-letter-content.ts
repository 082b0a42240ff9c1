import { exposureUnitLabels, type AgentKind, type ExposureUnit } from '@schema/agents';
import type { WorkerLetterContent, WorkerLetterResult } from '@schema/worker-letters';
import type { ResolvedActionLevel } from '@stats/action-level';
import { cautions as generalCautions } from './sampling-plans';

/*
 * The words of a worker letter (docs/decisions/024-worker-letters.md). Plain language, short
 * sentences, our own wording. Built once when the letter is drafted and stored as the letter's
 * content; the PDF and the e-mail are rendered from what is stored, never from these functions again.
 */

/**
 * The duty a letter names unless the hygienist names another (the local regulation). The US
 * federal noise rule is the worked example because its notification duty is explicit:
 * 29 CFR 1910.95(e) "Employee notification" (each employee exposed at or above an 8-hour TWA of
 * 85 dB is notified of the monitoring results). EU directive articles from memory
 * (2003/10/EC Art. 8; 98/24/EC Art. 8: information and training of workers).
 */
export function defaultDutyFor(agentKind: AgentKind): string {
  if (agentKind === 'noise') {
    return (
      'OSHA 29 CFR 1910.95(e), employee notification: each employee exposed at or above an 8-hour time-weighted average of 85 decibels is told the results of the noise monitoring. ' +
      'Where other rules apply (for example EU Directive 2003/10/EC, Article 8, worker information and training), follow the local regulation.'
    );
  }
  return (
    'Employee notification of exposure monitoring results under the regulation that applies to this substance (for example an OSHA substance-specific standard, or EU Directive 98/24/EC, Article 8, information and training for workers). ' +
    'Follow the local regulation.'
  );
}

/** A value with its unit, rounded for reading: dB(A) to 0.1 dB, everything else to 3 significant digits. */
export function valueText(value: number, unit: ExposureUnit): string {
  if (unit === 'dBA') return `${value.toFixed(1)} dB(A)`;
  const rounded = Number(value.toPrecision(3));
  const number = Math.abs(rounded) >= 1e-3 && Math.abs(rounded) < 1e6 ? String(rounded) : rounded.toExponential(2);
  return unit === 'dose-percent' ? `${number} % of the daily noise dose` : `${number} ${exposureUnitLabels[unit]}`;
}

export interface LetterInput {
  organizationName: string;
  letterDate: string;
  worker: { code: string; name: string | null; jobTitle: string };
  group: {
    id: number;
    name: string;
    agentName: string;
    agentKind: AgentKind;
    oelValue: number;
    oelUnit: ExposureUnit;
    oelSource: string;
  };
  actionLevel: ResolvedActionLevel;
  results: ReadonlyArray<{ id: number; date: string; value: number; unit: ExposureUnit }>;
  dutyCited: string;
  contact: { name: string; email: string };
}

/** One plain sentence on what the figure is. */
function unitExplanation(agentKind: AgentKind, unit: ExposureUnit): string {
  if (agentKind === 'noise' && unit === 'dose-percent') return 'A noise dose of 100 % is the most the exposure limit allows in one working day.';
  if (agentKind === 'noise') return 'A noise result is the average level over an 8-hour working day.';
  return 'A result is the average concentration in the air you breathed over the work shift.';
}

const plural = (count: number, one: string, many: string) => (count === 1 ? one : many);

/** Builds the letter's full content from the facts; pure (no database, no clock). */
export function buildWorkerLetter(input: LetterInput): WorkerLetterContent {
  const { group, actionLevel } = input;
  const noise = group.agentKind === 'noise';
  const levelText = valueText(actionLevel.value, actionLevel.unit as ExposureUnit);
  const limitText = valueText(group.oelValue, group.oelUnit);
  const results: WorkerLetterResult[] = input.results.map((result) => {
    const atOrAboveLimit = result.unit === group.oelUnit && result.value >= group.oelValue;
    return {
      shiftResultId: result.id,
      date: result.date,
      value: result.value,
      unit: result.unit,
      valueText: valueText(result.value, result.unit),
      comparison: atOrAboveLimit ? 'At or above the action level and at or above the exposure limit' : 'At or above the action level, below the exposure limit',
      atOrAboveLimit,
    };
  });
  const count = results.length;
  const overLimit = results.filter((result) => result.atOrAboveLimit).length;
  const what = noise ? 'noise' : group.agentName.toLowerCase();
  const shifts = plural(count, 'one work shift', `${count} work shifts`);

  const meaning: string[] = [
    `The action level for this work is ${levelText}. ${count === 1 ? 'Your result is' : 'Each of these results is'} at or above it. The action level is set below the exposure limit so that protection starts early.`,
    overLimit === 0
      ? `${count === 1 ? 'Your result is' : 'These results are'} below the exposure limit (${limitText}, ${group.oelSource}).`
      : `${overLimit === count ? (count === 1 ? 'Your result is' : 'All of these results are') : `${overLimit} of these results ${overLimit === 1 ? 'is' : 'are'}`} also at or above the exposure limit (${limitText}, ${group.oelSource}). Reducing this exposure is a priority.`,
  ];
  if (noise) {
    meaning.push(
      'Noise at this level, day after day over years, can cause hearing loss that does not heal. It happens slowly and without pain, so you may not notice it.',
      'The figure is the noise around you. It does not count any hearing protectors you wore.',
    );
  } else {
    meaning.push(
      'Breathing this substance at these levels over a long time may harm your health. How much depends on the substance, the amount and how long you are exposed.',
    );
  }

  const next = noise
    ? [
        'You will be offered a hearing check (an audiometric test), and repeat checks as the rules require. It is free for you.',
        'You will be offered hearing protectors that suit you, with help to choose them and to check that they fit.',
        'You will get training on noise, on wearing hearing protectors, and on the hearing checks.',
        'We will look at ways to make the work quieter.',
        'Until then, wear your hearing protectors whenever you are in noisy areas.',
      ]
    : [
        'We will look at ways to lower the exposure at its source, for example by enclosing the process, extracting the dust or fumes, using wet methods or changing how the work is done.',
        'Where the regulation for this substance requires medical checks (medical surveillance), you will be offered them.',
        'Keep using the protective equipment you have been given. Tell us if it does not fit or is damaged.',
      ];

  const name = input.worker.name?.trim() ? input.worker.name.trim() : null;
  return {
    subject: `Your ${what} exposure ${plural(count, 'result', 'results')} from ${input.organizationName}`,
    organizationName: input.organizationName,
    letterDate: input.letterDate,
    recipient: { code: input.worker.code, name, jobTitle: input.worker.jobTitle },
    greeting: name ? `Dear ${name},` : `Dear colleague (worker ${input.worker.code}),`,
    group: { id: group.id, name: group.name, agentName: group.agentName, agentKind: group.agentKind },
    results,
    actionLevel: { value: actionLevel.value, unit: actionLevel.unit as ExposureUnit, text: levelText, basis: actionLevel.basis },
    limit: { value: group.oelValue, unit: group.oelUnit, text: limitText, source: group.oelSource },
    introduction: `We measured your exposure to ${what} during ${shifts}${input.worker.jobTitle ? ` as ${input.worker.jobTitle.toLowerCase()}` : ''} (exposure group "${group.name}"). ${unitExplanation(group.agentKind, group.oelUnit)} This is what we found:`,
    sections: [
      { heading: 'What it means', paragraphs: meaning },
      { heading: 'What happens next', paragraphs: next },
      {
        heading: 'Why you get this letter',
        paragraphs: [
          `Your employer must tell you the results of exposure measurements like these. This letter serves that duty: ${input.dutyCited}`,
          'Where the rules in your country or state differ, the local regulation applies.',
        ],
      },
      {
        heading: 'Questions',
        paragraphs: [`If you have questions about this letter or your result, contact ${input.contact.name} (${input.contact.email}).`],
      },
    ],
    dutyCited: input.dutyCited,
    cautions: [
      `This letter reports measurements of particular shifts. Your exposure changes from day to day, so ${plural(count, 'one result does', 'these results do')} not show every day's exposure.`,
      ...generalCautions,
      `How the action level was chosen: ${actionLevel.basis}`,
    ],
    contact: input.contact,
    closing: `Yours sincerely,\n${input.contact.name}\n${input.organizationName}`,
  };
}

/** The letter as plain text (the e-mail's text part; also what a test reads back). */
export function letterPlainText(content: WorkerLetterContent): string {
  const lines: string[] = [content.greeting, '', 'YOUR RESULT', content.introduction];
  lines.push(...content.results.map((result) => `- ${result.date}: ${result.valueText} (${result.comparison.toLowerCase()})`), '');
  for (const section of content.sections) {
    lines.push(section.heading.toUpperCase());
    lines.push(...section.paragraphs);
    lines.push('');
  }
  lines.push('CAUTIONS', ...content.cautions.map((caution) => `- ${caution}`), '', content.closing, '');
  return lines.join('\n');
}
