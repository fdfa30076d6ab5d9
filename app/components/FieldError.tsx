/** The error line under a form field; its id is what the input's aria-describedby points to. */
export function FieldError({ id, message }: { id: string; message: string | null | undefined }) {
  if (!message) return null;
  return (
    <p className="field-error" id={id} role="alert">
      {message}
    </p>
  );
}

/** Props that tie an input to its error line. */
export function invalidProps(id: string, message: string | null | undefined) {
  return message ? { "aria-invalid": true as const, "aria-describedby": `${id}-error` } : {};
}
