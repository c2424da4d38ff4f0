// The views feature's public surface for other features (their api/ folders aside): how a mark reads
// and is edited, so the Bench shows a saved view's marks as the view page does.
export { EditableMarkBody } from './components/mark-editor';
export { MarkByline, MarkText } from './components/mark-card';
