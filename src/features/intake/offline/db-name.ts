/** The intake view's IndexedDB database (also named in public/sw.js, which clears it at sign-out). */
export const INTAKE_DB_NAME = 'blockpost-intake';
