/** Joins class names, skipping the falsy ones: `cx('a', on && 'b')`. */
export const cx = (...names: Array<string | false | null | undefined>): string => names.filter(Boolean).join(' ');
