// Immediate feedback in the browser with the same zod schema the action enforces.
import { useState, type FormEvent } from "react";
import type { z } from "zod";
import { fieldErrors, formObject, type FieldErrors } from "./forms";

export function useFormCheck(schema: z.ZodType, serverErrors?: FieldErrors) {
  const [clientErrors, setClientErrors] = useState<FieldErrors | null>(null);
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    const result = schema.safeParse(formObject(new FormData(event.currentTarget)));
    if (!result.success) {
      event.preventDefault();
      setClientErrors(fieldErrors(result.error));
    } else {
      setClientErrors(null);
    }
  };
  return { errors: clientErrors ?? serverErrors ?? {}, onSubmit };
}
