"use client";
/** Board photos: thumbnails (size-constrained by CSS, never re-encoded), captions, and upload for editors. */
import { useState } from "react";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { failureText, sendForm, sendJson } from "../../../client/http";
import { usePhotos } from "../entry-queries";
import css from "../entry.module.css";

const SIDE_WORD = { component: "component side", track: "track side", other: "other" } as const;

/** The photos section of the entry page. */
export function PhotosSection({ entryId, canEdit }: { entryId: string; canEdit: boolean }) {
  const photos = usePhotos(entryId);
  const client = useQueryClient();
  const [formKey, setFormKey] = useState(0);
  const refresh = () => client.invalidateQueries({ queryKey: ["entry", entryId, "photos"] });
  const upload = useMutation({
    mutationFn: (form: FormData) => sendForm(`/api/entries/${entryId}/photos`, form),
    onSuccess: () => {
      setFormKey((k) => k + 1);
      return refresh();
    },
  });
  const remove = useMutation({
    mutationFn: (photoId: string) =>
      sendJson(`/api/entries/${entryId}/photos/${photoId}`, {}, "DELETE"),
    onSuccess: refresh,
  });
  const list = photos.data ?? [];
  return (
    <div data-testid="photos">
      {photos.isError ? <p className={css.missing}>{failureText(photos.error)}</p> : null}
      {list.length === 0 && photos.isSuccess ? <p className="muted">No photos yet.</p> : null}
      <div className={css.thumbs}>
        {list.map((p) => (
          <figure key={p.id} className={css.thumb} style={{ margin: 0 }}>
            <a href={p.url} target="_blank" rel="noreferrer">
              {/* Served as uploaded; CSS fits it into the thumbnail box (no image library). */}
              <img
                src={p.url}
                alt={p.caption ?? `board photo, ${SIDE_WORD[p.side]}`}
                loading="lazy"
                {...(p.width && p.height ? { width: p.width, height: p.height } : {})}
              />
            </a>
            <figcaption>
              <strong>{SIDE_WORD[p.side]}</strong>
              {p.caption ? ` · ${p.caption}` : ""}
              <div className={css.meta}>
                {p.width && p.height ? `${p.width}×${p.height} px · ` : ""}
                {p.sizeBytes < 1024
                  ? `${p.sizeBytes} bytes`
                  : `${Math.round(p.sizeBytes / 1024)} KB`}
              </div>
              {canEdit ? (
                <button
                  type="button"
                  className={css.quiet}
                  disabled={remove.isPending}
                  onClick={() => remove.mutate(p.id)}
                >
                  Delete
                </button>
              ) : null}
            </figcaption>
          </figure>
        ))}
      </div>
      {canEdit ? (
        <form
          key={formKey}
          className={css.row}
          style={{ marginTop: "0.8rem" }}
          onSubmit={(e) => {
            e.preventDefault();
            const el = e.currentTarget;
            const file = (el.elements.namedItem("photoFile") as HTMLInputElement).files?.[0];
            if (!file) return;
            const form = new FormData();
            form.set("file", file, file.name);
            form.set("side", (el.elements.namedItem("photoSide") as HTMLSelectElement).value);
            const caption = (
              el.elements.namedItem("photoCaption") as HTMLInputElement
            ).value.trim();
            if (caption !== "") form.set("caption", caption);
            upload.mutate(form);
          }}
        >
          <input type="file" name="photoFile" accept="image/jpeg,image/png,image/webp" required />
          <select name="photoSide" defaultValue="component" aria-label="board side">
            <option value="component">component side</option>
            <option value="track">track side</option>
            <option value="other">other</option>
          </select>
          <input name="photoCaption" placeholder="caption" aria-label="caption" />
          <button type="submit" className={css.button} disabled={upload.isPending}>
            Upload photo
          </button>
          {upload.isError ? <span className={css.danger}>{failureText(upload.error)}</span> : null}
        </form>
      ) : null}
    </div>
  );
}
