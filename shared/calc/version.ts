/** Version of the calculation engine, saved with every calculation so that it can be re-run and compared. */
export const ENGINE_VERSION = '1.0.0'
