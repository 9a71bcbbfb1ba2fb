/** Library versions named in every result's provenance (checked against the installed packages by a unit test). */
export const ASTRONOMY_ENGINE_VERSION = '2.1.19';
export const ORBIT_NOTES_VERSION = '0.1.0';

export const ENGINE_LABEL = `astronomy-engine ${ASTRONOMY_ENGINE_VERSION}`;
