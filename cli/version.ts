/**
 * The program's version, as printed by --version and written into reports.
 */

/** The program's version; a test keeps it equal to package.json's. */
export const VERSION = '0.1.0';
