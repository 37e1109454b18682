// ASCII codes of the characters the byte-level readers (line-scanner.ts, clock-scan.ts, split-fields.ts) look for.
export const TAB = 0x09;
export const LF = 0x0a;
export const CR = 0x0d;
export const SPACE = 0x20;
export const QUOTE = 0x22; // "
export const HASH = 0x23; // #
export const PLUS = 0x2b;
export const COMMA = 0x2c;
export const MINUS = 0x2d;
export const DOT = 0x2e;
export const SLASH = 0x2f;
export const DIGIT_0 = 0x30;
export const DIGIT_9 = 0x39;
export const COLON = 0x3a;
export const LETTER_T = 0x54; // date-time separator of ISO 8601
export const LETTER_Z = 0x5a; // UTC designator of ISO 8601
