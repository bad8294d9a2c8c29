/** The software version recorded in outputs and QC records. Kept equal to package.json (tested). */
export const VERSION = '0.1.0';
