/**
 * Demo archive (sessions, stages, parts and runs) added on top of the base demo data.
 * Registered with extendDemo; filled in by the run archive work.
 */
export {};
