/**
 * Stamped into every dose plan and light solution so a stored plan can be traced to the
 * arithmetic that made it. Bump on any change to a formula, rounding rule or message.
 */
export const engineVersion = '1.1.0';
