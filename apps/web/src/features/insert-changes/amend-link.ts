/** The search parameter by which a link (the Timeline's entry) opens a change's amend form on the card. */
export const AMEND_INSERT_CHANGE_PARAM = 'amendInsertChange';

/** The Site file's address part that opens the amend form of insert change `id`. */
export const amendInsertChangeSearch = (id: string) => `?${AMEND_INSERT_CHANGE_PARAM}=${encodeURIComponent(id)}`;
