/** The JWT secret every Matchloom process of a scale-out test shares, so a session works on each. */
export const SCALE_JWT_SECRET = 'scale-tests-shared-secret-of-at-least-32-chars';
