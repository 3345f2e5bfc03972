/** Why remote images are off unless asked for. */
export function RemoteImagesHint() {
  return (
    <>
      Off unless you need it. A remote image is fetched from its server when the mail is opened, which tells
      that server who opened it and when. Without them, each image in the text shows as its description (its
      alt text); with them, only https images stay.
    </>
  );
}

export function UnsubscribeReminder() {
  return (
    <p className="rounded-md border border-line bg-paper px-4 py-3 text-sm text-muted">
      Only volunteers who opted in to newsletters get it, and every copy ends with a one-click link to
      unsubscribe and a link to their e-mail preferences.
    </p>
  );
}
