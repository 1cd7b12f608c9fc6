// What other features may use from the insert-changes feature: the Site file's insert card, and the
// Timeline's link to a change's amend form.
export { InsertChangesCard } from './components/insert-changes-card';
export { amendInsertChangeSearch } from './amend-link';
