// Length is what makes a password strong; no composition rules (NIST SP 800-63B, section 5.1.1.2, from memory).
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 128;
export const PASSWORD_RULE = `must be ${PASSWORD_MIN} to ${PASSWORD_MAX} characters long`;
