/**
 * Engine version, recorded with every computed step output and every locked snapshot.
 * Bump the minor number when any numerical result may change.
 */
export const ENGINE_VERSION = "0.4.0";
