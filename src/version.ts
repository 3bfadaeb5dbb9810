/** Tool version written into every result and provenance file. */
export const VERSION = '0.1.0';
