import { Fragment } from 'react';
import { tokenizeComment } from '@/lib/discussion/linkify';

/** A comment as text nodes only; http(s) URLs become links that pass nothing to their target. */
export function CommentBody({ body }: { body: string }) {
  return (
    <p className="whitespace-pre-wrap break-words" data-testid="comment-body">
      {tokenizeComment(body).map((t, i) =>
        t.kind === 'link' ? (
          <a key={i} href={t.href} rel="noopener noreferrer nofollow" target="_blank">
            {t.text}
          </a>
        ) : t.kind === 'mention' ? (
          <span key={i} className="font-medium text-accent-strong">
            {t.text}
          </span>
        ) : (
          <Fragment key={i}>{t.text}</Fragment>
        ),
      )}
    </p>
  );
}
