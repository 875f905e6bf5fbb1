import pkg from '../../package.json';

/** The software version stored beside every computed number and shown in reports. */
export const VERSION: string = pkg.version;
