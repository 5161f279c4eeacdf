/**
 * What the top-level help says of each command: the arguments after its name and its description.
 * Each command module takes its description from here, and the program lists the commands from
 * here for help, the version and unknown words, so that those load no command module at all
 * (test/cli/commandSummaries.test.ts checks the list against the commands as registered).
 */

/** One command in the top-level help. */
export interface CommandSummary {
  /** What follows the name in the list, as commander writes it, e.g. `[options] [config]`. */
  readonly usage: string;
  readonly description: string;
}

/** Every command, in the order help lists them. */
export const COMMAND_SUMMARIES = {
  terms: {
    usage: '[options] [config]',
    description: 'microstates, Russell–Saunders terms, Hund ground level and J levels of a configuration',
  },
  levels: {
    usage: '[options]',
    description:
      'levels of dⁿ in an octahedral or tetrahedral field, or in a complex of lower symmetry (--shape, --xyz, --tetragonal, --trigonal), labelled, with predicted band positions',
  },
  ions: {
    usage: '[options]',
    description: 'the built-in free-ion Racah parameters and spin–orbit constants, with sources',
  },
  fit: {
    usage: '[options]',
    description:
      'fit Dq and Racah B (and C) to observed d–d band maxima, assigning the bands; with a geometry (--shape, --xyz, --tetragonal, --trigonal) fit eσ/eπ or Ds/Dt and B of a distorted complex',
  },
  diagram: {
    usage: '[options] [config]',
    description:
      'correlation (Tanabe–Sugano-style) diagram of dⁿ at a chosen C/B, or the levels of a distorted complex along a distortion (--distort with a geometry): figure and curve data',
  },
  crossover: {
    usage: '[options] [config]',
    description:
      'high-spin/low-spin crossover of dⁿ: where it lies, which side a sample is on, LFSE and pairing, spin-only moments, map',
  },
  magnetism: {
    usage: '[options]',
    description:
      'magnetic moment against temperature with spin–orbit coupling (χ, χT, μ_eff from all states), beside spin-only',
  },
  spectrum: {
    usage: '[options] <file>',
    description:
      'find the d–d bands of a measured UV-vis-NIR spectrum (CSV/TSV/text or JCAMP-DX) and draw them',
  },
  report: {
    usage: '[options] <sheet>',
    description:
      'fit every sample of a sample sheet and write a report folder (HTML, Markdown, CSV, JSON, figures)',
  },
  demo: {
    usage: '[options]',
    description: 'run the whole job on the built-in invented demo series and write its report',
  },
  explore: {
    usage: '[options]',
    description:
      'write an interactive page (one self-contained HTML file): sliders for Dq, B, C/B and ζ, the correlation diagram, the levels and the sample’s bands and spectrum, live',
  },
} as const satisfies Record<string, CommandSummary>;

/** The name of a command. */
export type CommandName = keyof typeof COMMAND_SUMMARIES;
