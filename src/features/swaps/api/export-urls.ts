/** Download links for the CSV exports (plain links: the browser saves the attachment). */
export const rosterCsvUrl = (swapId: number) => `/api/swaps/${swapId}/export/roster.csv`;
export const distributionCsvUrl = (swapId: number) => `/api/swaps/${swapId}/export/distribution.csv`;
