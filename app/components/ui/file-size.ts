// Refusing an oversized file in the browser, before anything is sent: the input's own validity
// message (the server refuses it again while reading, whatever the browser did).

/** The sentence for the first file over `maxBytes` in `files`, or "" when every file fits. */
export function oversizeMessage(files: ArrayLike<{ name: string; size: number }> | null, maxBytes: number): string {
  for (const file of Array.from(files ?? [])) {
    if (file.size > maxBytes)
      return `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB: the limit is ${(maxBytes / 1024 / 1024).toFixed(0)} MB. Choose a smaller file.`;
  }
  return "";
}

/** An onChange handler for a file input: marks the input invalid (so its form will not send) while a file is too big. */
export function guardFileSize(maxBytes: number) {
  return (event: { currentTarget: HTMLInputElement }) => {
    const input = event.currentTarget;
    input.setCustomValidity(oversizeMessage(input.files, maxBytes));
    input.reportValidity();
  };
}
