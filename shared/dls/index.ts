/** DLS physics: constants, water properties, Stokes–Einstein, cumulants, correlation import. */
export * from './constants';
export * from './water';
export * from './stokes-einstein';
export * from './cumulants';
export * from './correlation-csv';
