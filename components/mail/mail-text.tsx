/** A plain-text message with its URLs as links (only our own absolute http(s) URLs appear). */
export function MailText({ text }: { text: string }) {
  return text.split(/(https?:\/\/\S+)/g).map((part, i) =>
    /^https?:\/\//.test(part) ? (
      <a key={i} href={part} className="break-all text-verdigris underline">
        {part}
      </a>
    ) : (
      part
    ),
  );
}
