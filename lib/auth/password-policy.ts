// ASVS 6.2.1 / 6.2.9: at least 12 characters here, up to 128, any characters allowed.
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 128;
