import { describe, expect, it } from "vitest";
import * as newComponent from "~/routes/components.new";
import * as editComponent from "~/routes/components.$componentId.edit";
import * as componentPage from "~/routes/components.$componentId";
import * as componentList from "~/routes/components._index";
import { Component, ComponentLiftPoint, getComponent, listComponentFiles } from "~/models/component.server";
import { StoredFile } from "~/models/stored-file.server";
import { componentFields } from "../support/component-fields";
import { callRoute, getRequest, makeUser, postForm, sessionCookie } from "../support/factories";
import { ELF_BYTES, PNG_BYTES } from "../support/gear";

async function plannerWithComponent() {
  const planner = await makeUser(["planner"]);
  const res = await callRoute(newComponent.action, await postForm("/components/new", componentFields(), planner));
  expect(res.status).toBe(302);
  const id = res.headers.get("Location")!.split("/").pop()!;
  return { planner, id };
}

describe("components", () => {
  it("a planner builds a component with lift points and reads it back in their units", async () => {
    const { planner, id } = await plannerWithComponent();
    const page = await callRoute(componentPage.loader, await getRequest(`/components/${id}`, planner), {
      componentId: id,
    });
    expect(page.data).toMatchObject({
      version: 1,
      definition: { name: "Test element", massKg: 2000, liftPoints: [{ label: "A" }, { label: "B" }] },
    });
  });

  it("bad input changes nothing", async () => {
    const { planner, id } = await plannerWithComponent();
    const res = await callRoute(
      editComponent.action,
      await postForm(
        `/components/${id}/edit`,
        { ...componentFields({ mass: "heavy", "lp-0-label": "" }), version: "1" },
        planner,
      ),
      { componentId: id },
    );
    expect(res.status).toBe(400);
    const component = await getComponent(planner.organisationId, Number(id));
    expect(component?.massKg).toBe(2000);
    expect(component?.version).toBe(1);
    expect(await ComponentLiftPoint.count({ where: { componentId: Number(id) } })).toBe(2);
  });

  it("a stale edit gets 409 and does not overwrite the newer version", async () => {
    const { planner, id } = await plannerWithComponent();
    const first = await callRoute(
      editComponent.action,
      await postForm(`/components/${id}/edit`, { ...componentFields({ mass: "2100" }), version: "1" }, planner),
      { componentId: id },
    );
    expect(first.status).toBe(302);
    const stale = await callRoute(
      editComponent.action,
      await postForm(`/components/${id}/edit`, { ...componentFields({ mass: "9999" }), version: "1" }, planner),
      { componentId: id },
    );
    expect(stale.status).toBe(409);
    const component = await getComponent(planner.organisationId, Number(id));
    expect(component?.massKg).toBe(2100);
    expect(component?.version).toBe(2);
  });

  it("archiving hides a component from the list; restoring brings it back", async () => {
    const { planner, id } = await plannerWithComponent();
    await callRoute(componentPage.action, await postForm(`/components/${id}`, { intent: "archive" }, planner), {
      componentId: id,
    });
    const list = await callRoute(componentList.loader, await getRequest("/components", planner));
    expect((list.data as { components: unknown[] }).components).toHaveLength(0);
    const archived = await callRoute(componentList.loader, await getRequest("/components?archived=1", planner));
    expect((archived.data as { components: Array<{ id: number }> }).components.map((c) => c.id)).toEqual([Number(id)]);
    await callRoute(componentPage.action, await postForm(`/components/${id}`, { intent: "restore" }, planner), {
      componentId: id,
    });
    expect((await Component.findByPk(Number(id)))?.archivedAt).toBeNull();
  });

  it("riggers read components but cannot change them", async () => {
    const { planner, id } = await plannerWithComponent();
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    expect(
      (await callRoute(componentPage.loader, await getRequest(`/components/${id}`, rigger), { componentId: id }))
        .status,
    ).toBe(200);
    expect(
      (await callRoute(newComponent.action, await postForm("/components/new", componentFields(), rigger))).status,
    ).toBe(403);
    expect(
      (
        await callRoute(componentPage.action, await postForm(`/components/${id}`, { intent: "archive" }, rigger), {
          componentId: id,
        })
      ).status,
    ).toBe(403);
    expect(
      (await callRoute(editComponent.loader, await getRequest(`/components/${id}/edit`, rigger), { componentId: id }))
        .status,
    ).toBe(403);
  });

  it("another organisation's component is not found", async () => {
    const { id } = await plannerWithComponent();
    const stranger = await makeUser(["planner"]);
    expect(
      (await callRoute(componentPage.loader, await getRequest(`/components/${id}`, stranger), { componentId: id }))
        .status,
    ).toBe(404);
    const edit = await callRoute(
      editComponent.action,
      await postForm(`/components/${id}/edit`, { ...componentFields({ name: "Hijack" }), version: "1" }, stranger),
      { componentId: id },
    );
    expect(edit.status).toBe(404);
    expect((await Component.findByPk(Number(id)))?.name).toBe("Test element");
  });
});

async function uploadRequest(id: string, user: { id: number }, file: File, fields: Record<string, string> = {}) {
  const form = new FormData();
  form.set("intent", "upload");
  form.set("kind", "photo");
  form.set("caption", "Lift points seen from above");
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set("file", file);
  return new Request(`http://localhost:3000/components/${id}`, {
    method: "POST",
    body: form,
    headers: { Cookie: await sessionCookie(user) },
  });
}

describe("component drawings and photos", () => {
  it("stores an upload by its content type, not its name, and lists it", async () => {
    const { planner, id } = await plannerWithComponent();
    const res = await callRoute(
      componentPage.action,
      await uploadRequest(id, planner, new File([PNG_BYTES], "drawing.pdf", { type: "application/pdf" })),
      { componentId: id },
    );
    expect(res.status).toBe(302);
    const [file] = await listComponentFiles(Number(id));
    expect(file?.storedFile?.contentType).toBe("image/png");
    expect(file?.storedFile?.storageKey).toMatch(/^[a-f0-9]{32}$/);
    const page = await callRoute(componentPage.loader, await getRequest(`/components/${id}`, planner), {
      componentId: id,
    });
    expect((page.data as { files: Array<{ caption: string }> }).files).toEqual([
      expect.objectContaining({ caption: "Lift points seen from above", contentType: "image/png" }),
    ]);
  });

  it("refuses an executable and an empty form, keeping nothing", async () => {
    const { planner, id } = await plannerWithComponent();
    const exe = await callRoute(
      componentPage.action,
      await uploadRequest(id, planner, new File([ELF_BYTES], "photo.png", { type: "image/png" })),
      { componentId: id },
    );
    expect(exe.status).toBe(400);
    expect((exe.data as { errors: { file: string[] } }).errors.file[0]).toMatch(/./);
    expect(await listComponentFiles(Number(id))).toHaveLength(0);
    expect(await StoredFile.count({ where: { organisationId: planner.organisationId } })).toBe(0);
  });

  it("riggers cannot upload", async () => {
    const { planner, id } = await plannerWithComponent();
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    const res = await callRoute(componentPage.action, await uploadRequest(id, rigger, new File([PNG_BYTES], "p.png")), {
      componentId: id,
    });
    expect(res.status).toBe(403);
    expect(await StoredFile.count({ where: { organisationId: planner.organisationId } })).toBe(0);
  });
});
