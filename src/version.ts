/** The service's name and version; a test holds VERSION equal to package.json's version. */
export const SERVICE_NAME = 'spacetide';
export const VERSION = '0.1.0';
