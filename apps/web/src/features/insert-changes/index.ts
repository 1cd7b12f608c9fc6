// What other features may use from the insert-changes feature: the Site file's insert card.
export { InsertChangesCard } from './components/insert-changes-card';
