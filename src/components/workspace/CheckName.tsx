import { checkLabel } from '../../lib/design-words.ts';

/**
 * A check's readable name, its stable id in a tooltip (title) and, for screen readers, as visually hidden
 * text: the id stays findable without a second visible line.
 */
export default function CheckName({ id }: { id: string }) {
  return (
    <span title={`Check id: ${id}`} data-check-name={id}>
      {checkLabel(id)}
      <span className="sr-only"> (check id {id})</span>
    </span>
  );
}
