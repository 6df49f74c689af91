// Small replies several routes share.

/** A change that has nothing more to say. */
export interface OkReply { ok: true }

/** A change done, with words for the person. */
export interface OkMessage { ok: true, message: string }

/** An autosave stored. */
export interface DraftSaved { savedAt: string }

/** One page of a list that grows (`listPaging` in shared/schemas/common.ts). */
export interface Page<T> { items: T[], total: number, page: number, pageSize: number }
