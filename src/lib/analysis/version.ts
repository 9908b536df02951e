/** Version of the analysis engine, stored in every assessment snapshot. */
export const ENGINE_VERSION = '1.0.0';
