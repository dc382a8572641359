/**
 * Keywords as one line, each isolated for bidirectional text (<bdi>): a keyword in a right-to-left script,
 * or one with an unclosed direction mark (U+202E and the like), keeps its direction to itself instead of
 * reversing the keywords and commas after it.
 */
import { Fragment } from "react";

export function KeywordList({ keywords }: { keywords: string[] }) {
  return (
    <>
      {keywords.map((k, i) => (
        <Fragment key={i}>
          {i > 0 && ", "}
          <bdi>{k}</bdi>
        </Fragment>
      ))}
    </>
  );
}
