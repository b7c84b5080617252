/** Where a line's desk lives. */
export const linePath = (lineId: number) => `/engineering/lines/${lineId}`;
