import { useId, type ReactNode } from 'react';

// A labelled input with its inline problems (from the scenario parser) below it.

export function Field({ label, messages, hint, children, className }: {
  label: ReactNode;
  messages: string[];
  hint?: ReactNode;
  className?: string;
  children: (props: { id: string; 'aria-invalid': boolean; 'aria-describedby': string | undefined }) => ReactNode;
}) {
  const id = useId();
  const msgId = `${id}-msg`;
  const hintId = `${id}-hint`;
  const described = [messages.length ? msgId : '', hint ? hintId : ''].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`field${messages.length ? ' invalid' : ''}${className ? ' ' + className : ''}`}>
      <label htmlFor={id}>{label}</label>
      {children({ id, 'aria-invalid': messages.length > 0, 'aria-describedby': described })}
      {hint && <span className="hint" id={hintId}>{hint}</span>}
      {messages.length > 0 && (
        <span className="field-msg" id={msgId} role="alert">
          {messages.join(' ')}
        </span>
      )}
    </div>
  );
}
