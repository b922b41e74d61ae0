// A captured e-mail's plain-text body with its http(s) links made clickable. The text is rendered as
// text (never as HTML), so nothing in a message can run in the admin's page.
const LINK = /(https?:\/\/[^\s<>"']+)/g;

export function LinkedText({ text }: { text: string }) {
  const parts = text.split(LINK);
  return (
    <p className="text-sm leading-relaxed break-words whitespace-pre-wrap text-ink-700">
      {parts.map((part, index) =>
        index % 2 === 1 ? (
          <a key={index} href={part} className="text-plate-700 underline underline-offset-2" data-testid="mail-link">
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </p>
  );
}
