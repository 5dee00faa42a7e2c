/** Top-level design fields written together in one edit (a field set to undefined is removed). */
import type { DesignField } from '../../../../shared/collab/schema';

export type DesignPatch = Partial<Record<DesignField, unknown>>;
