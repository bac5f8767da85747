import { Fragment } from 'react';

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** Plain text with its web addresses made into links; nothing else is interpreted. */
export function LinkedText({ text }: { text: string }) {
  return (
    <>
      {text.split(URL_PATTERN).map((part, i) => {
        if (i % 2 === 0) return <Fragment key={i}>{part}</Fragment>;
        // A sentence's full stop or closing bracket is not part of the address.
        const url = part.replace(/[.,;:!?)\]]+$/, '');
        return (
          <Fragment key={i}>
            <a href={url} target="_blank" rel="noopener noreferrer nofollow" className="break-all text-rootstock underline">
              {url}
            </a>
            {part.slice(url.length)}
          </Fragment>
        );
      })}
    </>
  );
}
