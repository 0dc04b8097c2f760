/**
 * The fixed word lists the procedure schema and the run events share: units, hazards,
 * dispositions and roles. Plain constants with no schema library, so the runner's browser
 * bundle can use them without loading the full procedure schema.
 */
export const TORQUE_UNITS = ['N·m', 'ft·lbf', 'in·lbf', 'kgf·m', 'kgf·cm'] as const;
export const LENGTH_UNITS = ['mm', 'µm', 'in', 'thou'] as const;
export const ANGLE_UNITS = ['deg', 'turn'] as const;

export const HAZARDS = ['lifting', 'pressurised-fuel', 'hot-fluid', 'spring-pressure', 'stored-energy', 'chemical', 'electrical'] as const;
export const DISPOSITIONS = ['reuse', 'replace', 'machine-shop', 'scrap'] as const;
export const ROLES = ['owner', 'lead', 'technician', 'reviewer'] as const;

/** Messages shared by both schema flavours, so a person reads the same words wherever a check fails. */
export const MESSAGES = {
  finite: 'Must be a finite number',
  positive: 'Must be greater than zero',
} as const;
