// ifccheck service page: sign in with a token, submit models, follow their checks.
// The token lives in sessionStorage (this tab only) and goes out as a Bearer
// header; files are opened through short-lived signed links from the API.
"use strict";

(() => {
  const KEY = "ifccheck.token";
  const API = "/api/v1";
  const $ = (id) => document.getElementById(id);
  let timer = null;

  const token = () => sessionStorage.getItem(KEY);

  async function detail(response) {
    try {
      const body = await response.json();
      return typeof body.detail === "string" ? body.detail : JSON.stringify(body.detail);
    } catch (err) {
      return `${response.status} ${response.statusText}`;
    }
  }

  async function api(path, options = {}) {
    const headers = new Headers(options.headers || {});
    headers.set("Authorization", `Bearer ${token()}`);
    const response = await fetch(path, { ...options, headers });
    if (response.status === 401) {
      signOut("The token was not accepted: it is unknown or has been revoked.");
      throw new Error("not signed in");
    }
    return response;
  }

  function showApp(signedIn) {
    $("signin").hidden = signedIn;
    $("app").hidden = !signedIn;
    $("signout").hidden = !signedIn;
  }

  function signOut(message) {
    sessionStorage.removeItem(KEY);
    clearTimeout(timer);
    $("submissions").tBodies[0].replaceChildren();
    showApp(false);
    $("signin-error").textContent = message || "";
  }

  function el(tag, text, cls) {
    const node = document.createElement(tag);
    if (text !== undefined && text !== null) node.textContent = text;
    if (cls) node.className = cls;
    return node;
  }

  function summaryText(check) {
    const s = check.summary;
    if (!s) return "";
    let text = `${s.total} beams: ${s.pass} pass, ${s.fail} fail, ${s.not_checked} not checked`;
    if (check.diff) {
      const n = check.diff.weakened;
      text += `; ${n} weakened since the previous revision`;
    }
    return text;
  }

  async function openFile(id, name, download) {
    // open the tab now, while the click still counts as the user's, and point it later
    const tab = download ? null : window.open("", "_blank");
    let response;
    try {
      response = await api(`${API}/submissions/${id}/files/${name}/link`, { method: "POST" });
    } catch (err) {
      if (tab) tab.close();
      return;
    }
    if (!response.ok) {
      if (tab) tab.close();
      $("upload-message").textContent = await detail(response);
      return;
    }
    const { url } = await response.json();
    if (tab) {
      tab.opener = null;
      tab.location.href = url;
    } else {
      const a = document.createElement("a");
      a.href = url;
      a.download = "";
      document.body.append(a);
      a.click();
      a.remove();
    }
  }

  function fileCell(check) {
    const td = el("td", null, "files");
    if (check.status === "errored") {
      td.append(el("span", check.error, "error"));
      return td;
    }
    const names = Object.keys(check.files);
    const opened = ["report.html", "diff.html"];
    for (const [name, label] of [["report.html", "Open report"], ["diff.html", "Open diff"]]) {
      if (names.includes(name)) {
        const b = el("button", label, "open");
        b.type = "button";
        b.dataset.file = name;
        b.addEventListener("click", () => openFile(check.id, name, false));
        td.append(b);
      }
    }
    // the reports open with the buttons above; the other files download (each listed once)
    const downloads = names.filter((n) => !opened.includes(n));
    if (downloads.length) td.append(el("div", "Download:", "label"));
    for (const name of downloads) {
      const b = el("button", name, "download");
      b.type = "button";
      b.title = `Download ${name}`;
      b.dataset.file = name;
      b.addEventListener("click", () => openFile(check.id, name, true));
      td.append(b);
    }
    return td;
  }

  function comparedWith(check, byId) {
    const td = el("td", null, "compared");
    if (!check.compared_with) return td;
    const earlier = byId.get(check.compared_with);
    const text = earlier
      ? `${earlier.model_file}, submitted ${new Date(earlier.created_at).toLocaleString()}`
      : "the previous revision";
    td.append(el("span", text));
    td.title = `submission ${check.compared_with}`;
    return td;
  }

  function row(check, byId) {
    const tr = el("tr");
    tr.dataset.id = check.id;
    tr.dataset.status = check.status;
    tr.append(el("td", new Date(check.created_at).toLocaleString()));
    tr.append(el("td", check.model_key || "—"));
    tr.append(el("td", check.model_file));
    const status = el("td");
    status.append(el("span", check.status, `status status-${check.status}`));
    if (check.status === "checking") {
      const bar = el("progress");
      bar.max = 1;
      bar.value = check.progress;
      status.append(" ", bar);
    }
    tr.append(status);
    const beams = el("td", summaryText(check));
    if (check.summary && check.summary.fail > 0) beams.classList.add("failures");
    tr.append(beams);
    tr.append(comparedWith(check, byId));
    tr.append(fileCell(check));
    return tr;
  }

  async function refresh() {
    clearTimeout(timer);
    if (!token()) return;
    const key = $("filter").value.trim();
    const query = key ? `?model_key=${encodeURIComponent(key)}` : "";
    let active = false;
    try {
      const response = await api(`${API}/submissions${query}`);
      if (response.ok) {
        const { submissions } = await response.json();
        const byId = new Map(submissions.map((c) => [c.id, c]));
        $("submissions").tBodies[0].replaceChildren(...submissions.map((c) => row(c, byId)));
        $("empty").hidden = submissions.length > 0;
        active = submissions.some((c) => c.status === "received" || c.status === "checking");
      }
    } catch (err) {
      if (!token()) return;
    }
    timer = setTimeout(refresh, active ? 1000 : 8000);
  }

  $("signin-form").addEventListener("submit", async (event) => {
    event.preventDefault();
    const candidate = $("token").value.trim();
    const response = await fetch(`${API}/submissions?limit=1`, {
      headers: { Authorization: `Bearer ${candidate}` },
    });
    if (!response.ok) {
      $("signin-error").textContent =
        response.status === 401 ? "The token was not accepted." : await detail(response);
      return;
    }
    sessionStorage.setItem(KEY, candidate);
    $("token").value = "";
    $("signin-error").textContent = "";
    showApp(true);
    refresh();
  });

  $("signout").addEventListener("click", () => signOut(""));

  $("filter-form").addEventListener("submit", (event) => {
    event.preventDefault();
    refresh();
  });

  $("upload-form").addEventListener("submit", async (event) => {
    event.preventDefault();
    const form = event.target;
    const data = new FormData();
    for (const [name, value] of new FormData(form).entries()) {
      const empty = value instanceof File ? value.size === 0 && !value.name : value === "";
      if (!empty) data.append(name, value);
    }
    const button = $("upload-button");
    button.disabled = true;
    $("upload-message").textContent = "Uploading…";
    try {
      const response = await api(`${API}/submissions`, { method: "POST", body: data });
      if (response.status === 202) {
        const { id } = await response.json();
        $("upload-message").textContent = `Received as submission ${id}.`;
        form.reset();
        refresh();
      } else {
        $("upload-message").textContent = `Not accepted: ${await detail(response)}`;
      }
    } catch (err) {
      if (token()) $("upload-message").textContent = `Upload failed: ${err.message}`;
    } finally {
      button.disabled = false;
    }
  });

  if (token()) {
    showApp(true);
    refresh();
  } else {
    showApp(false);
  }
})();
