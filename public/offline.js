// The page the service worker shows for a page not kept on the phone: the plans that are kept, from the
// phone's store (the "kept" table the app writes through Dexie), each with when its gear was last checked.
(function () {
  const list = document.getElementById("kept");
  function show(plans) {
    list.textContent = "";
    if (!plans.length) {
      const p = document.createElement("p");
      p.textContent = "No plan is kept on this phone. With signal, open a plan's lift page and keep it on this phone.";
      list.appendChild(p);
      return;
    }
    for (const plan of plans) {
      const a = document.createElement("a");
      a.className = "plan";
      a.href = "/plans/" + plan.planId + "/lift";
      a.textContent = plan.title;
      const when = document.createElement("span");
      const d = new Date(plan.checkedAt);
      when.textContent = "Gear last checked current " + d.toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" });
      a.appendChild(when);
      list.appendChild(a);
    }
  }
  const open = indexedDB.open("plumbline");
  open.onupgradeneeded = function () {
    // The app never ran on this phone: nothing is kept.
    open.transaction.abort();
  };
  open.onerror = function () {
    show([]);
  };
  open.onsuccess = function () {
    const db = open.result;
    if (!db.objectStoreNames.contains("kept")) return show([]);
    const all = db.transaction("kept").objectStore("kept").getAll();
    all.onsuccess = function () {
      show(all.result);
    };
    all.onerror = function () {
      show([]);
    };
  };
})();
