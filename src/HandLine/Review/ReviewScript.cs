using System.Security.Cryptography;
using System.Text;

namespace HandLine.Review;

/// <summary>
/// The review page's one script. It reads the page's data from a JSON block, builds the line cards with DOM calls
/// (text goes in through textContent and value, never as markup, so a transcript cannot become code), renders cards
/// in chunks and sets each image when its card comes near the screen (a run of 10,000 flagged lines stays
/// responsive), keeps the editor's work in local storage, and exports the corrections as TSV. The page's
/// Content-Security-Policy allows this script by its hash and nothing else.
/// </summary>
internal static class ReviewScript
{
    /// <summary>The CSP source expression that allows exactly <see cref="Text"/>.</summary>
    public static string CspHash { get; } =
        "'sha256-" + Convert.ToBase64String(SHA256.HashData(Encoding.UTF8.GetBytes(Text))) + "'";

    public const string Text = """

        "use strict";
        (function () {
          const data = JSON.parse(document.getElementById("review-data").textContent);
          const lines = data.lines;
          const CHUNK = 60;
          const key = (l) => l.s + "\u0000" + l.l;
          let state = { current: 0, edits: {} };
          try {
            const saved = JSON.parse(localStorage.getItem(data.key) || "null");
            if (saved && typeof saved === "object" && saved.edits) state = saved;
          } catch (e) { /* unreadable storage: start afresh */ }
          if (!(state.current >= 0 && state.current < lines.length)) state.current = 0;
          const list = document.getElementById("lines");
          const progress = document.getElementById("progress");
          const cards = [];
          let rendered = 0;

          function save() {
            try { localStorage.setItem(data.key, JSON.stringify(state)); }
            catch (e) { progress.textContent += " (not saved: the browser's storage is full or off)"; }
          }
          function clean(text) { return text.replace(/[\t\r\n]+/g, " "); }
          function el(tag, cls, text) {
            const node = document.createElement(tag);
            if (cls) node.className = cls;
            if (text !== undefined) node.textContent = text;
            return node;
          }
          const labels = { accepted: "accepted", corrected: "corrected", picked: "alternative chosen", illegible: "illegible" };
          function status(i) {
            const edit = state.edits[key(lines[i])];
            const card = cards[i];
            if (!card) return;
            const badge = card.querySelector(".status");
            badge.textContent = edit ? "✔ " + labels[edit.s] : lines[i].x ? "corrected before" : "to check";
            card.dataset.status = edit ? edit.s : "open";
          }
          function updateProgress() {
            let done = 0, illegible = 0, changed = 0;
            for (const l of lines) {
              const edit = state.edits[key(l)];
              if (!edit) continue;
              done++;
              if (edit.s === "illegible") illegible++;
              else if (edit.t !== l.m) changed++;
            }
            progress.textContent = done + " of " + lines.length + " lines checked (" + changed + " changed, " + illegible + " illegible)";
          }
          const imageWatch = "IntersectionObserver" in window ? new IntersectionObserver((entries) => {
            for (const entry of entries) {
              if (!entry.isIntersecting) continue;
              const card = entry.target;
              const img = card.querySelector("img.line-image");
              if (img && !img.getAttribute("src")) img.src = lines[Number(card.dataset.index)].img;
              imageWatch.unobserve(card);
            }
          }, { rootMargin: "800px 0px" }) : null;

          function card(i) {
            const l = lines[i];
            const article = el("article", "line");
            article.id = "line-" + i;
            article.dataset.index = String(i);
            article.tabIndex = -1;
            const meta = el("div", "meta");
            meta.append(el("span", "pos", (i + 1) + " / " + lines.length), " ", el("code", "source", l.s),
              " line " + (l.l + 1) + " · confidence " + l.c.toFixed(2) + " ", el("span", "status"));
            article.append(meta);
            if (l.img) {
              const img = el("img", "line-image");
              img.alt = "image of " + l.s + ", line " + (l.l + 1);
              article.append(img);
              if (l.w) article.append(el("p", "note", "The page's lines could not be found again: the whole page is shown; check line " + (l.l + 1) + "."));
              if (imageWatch) imageWatch.observe(article); else img.src = l.img;
            } else {
              article.append(el("p", "noimage", "(image not found under the images folder)"));
            }
            const machine = el("div", "machine");
            machine.append(el("span", "who", "Machine"));
            const text = el("span", "t");
            if (l.d) {
              for (const [symbol, doubtful] of l.d) {
                if (doubtful) {
                  const mark = el("mark", "doubt", symbol === " " ? "␣" : symbol);
                  mark.title = "doubtful character";
                  text.append(mark);
                } else text.append(symbol);
              }
            } else text.textContent = l.t;
            machine.append(text);
            article.append(machine);
            if (l.a.length) {
              const alts = el("ol", "alts");
              alts.setAttribute("aria-label", "Alternatives");
              l.a.forEach((alt, n) => {
                const item = el("li");
                const button = el("button", "alt", alt);
                button.type = "button";
                button.dataset.alt = String(n);
                button.addEventListener("click", () => { go(i); pick(n); });
                item.append(el("kbd", "", String(n + 1)), " ", button);
                alts.append(item);
              });
              article.append(alts);
            }
            const label = el("label", "edit-label", "Text ");
            const box = el("textarea", "edit");
            box.rows = 1;
            box.spellcheck = false;
            const edit = state.edits[key(l)];
            box.value = edit ? edit.t : l.t;
            box.addEventListener("input", () => {
              state.edits[key(l)] = { t: clean(box.value), s: "corrected" };
              status(i); updateProgress(); save();
            });
            box.addEventListener("focus", () => { if (state.current !== i) go(i, true); });
            label.append(box);
            article.append(label);
            article.addEventListener("click", (e) => { if (e.target === article || e.target.tagName === "IMG") go(i); });
            return article;
          }
          function renderUpTo(n) {
            n = Math.min(n, lines.length);
            const fragment = document.createDocumentFragment();
            for (; rendered < n; rendered++) {
              cards[rendered] = card(rendered);
              fragment.append(cards[rendered]);
            }
            list.insertBefore(fragment, sentinel);
            for (let i = 0; i < n; i++) status(i);
          }
          const sentinel = el("div", "more");
          list.append(sentinel);
          if ("IntersectionObserver" in window)
            new IntersectionObserver((entries) => { if (entries.some((e) => e.isIntersecting)) renderUpTo(rendered + CHUNK); }).observe(sentinel);

          function go(i, keepFocus) {
            if (i < 0 || i >= lines.length) return;
            renderUpTo(Math.max(rendered, i + CHUNK / 2));
            if (cards[state.current]) { cards[state.current].classList.remove("current"); cards[state.current].removeAttribute("aria-current"); }
            state.current = i;
            const c = cards[i];
            c.classList.add("current");
            c.setAttribute("aria-current", "true");
            if (!keepFocus) { c.focus({ preventScroll: true }); c.scrollIntoView({ block: "center" }); }
            save();
          }
          function decide(value, how) {
            const l = lines[state.current];
            state.edits[key(l)] = { t: clean(value), s: how };
            cards[state.current].querySelector("textarea.edit").value = clean(value);
            status(state.current); updateProgress(); save();
            go(Math.min(state.current + 1, lines.length - 1));
          }
          function pick(n) {
            const l = lines[state.current];
            if (n < l.a.length) decide(l.a[n], "picked");
          }
          function exportTsv() {
            const esc = (s) => String(s).replace(/\\/g, "\\\\").replace(/\t/g, "\\t").replace(/\n/g, "\\n").replace(/\r/g, "\\r");
            const rows = ["source\tline\ttext\tmachine\tillegible"];
            for (const l of lines) {
              const edit = state.edits[key(l)];
              if (edit) rows.push([esc(l.s), l.l, esc(edit.t), esc(l.m), edit.s === "illegible" ? "true" : "false"].join("\t"));
            }
            const blob = new Blob([rows.join("\n") + "\n"], { type: "text/tab-separated-values;charset=utf-8" });
            const a = el("a");
            a.href = URL.createObjectURL(blob);
            a.download = "corrections.tsv";
            document.body.append(a);
            a.click();
            a.remove();
            setTimeout(() => URL.revokeObjectURL(a.href), 10000);
          }
          document.getElementById("export").addEventListener("click", exportTsv);
          document.addEventListener("keydown", (e) => {
            if (e.ctrlKey || e.metaKey || e.altKey || !lines.length) return;
            const box = cards[state.current] && cards[state.current].querySelector("textarea.edit");
            if (e.target instanceof HTMLTextAreaElement) {
              if (e.key === "Enter" && !e.shiftKey) {
                e.preventDefault();
                const l = lines[state.current];
                const value = clean(e.target.value);
                e.target.blur();
                decide(value, value === l.t ? "accepted" : "corrected");
              } else if (e.key === "Escape") {
                e.preventDefault();
                e.target.blur();
                cards[state.current].focus({ preventScroll: true });
              }
              return;
            }
            if (e.target instanceof HTMLButtonElement && (e.key === "Enter" || e.key === " ")) return;
            switch (e.key) {
              case "j": case "ArrowDown": go(Math.min(state.current + 1, lines.length - 1)); break;
              case "k": case "ArrowUp": go(Math.max(state.current - 1, 0)); break;
              case "a": decide(box.value, "accepted"); break;
              case "1": case "2": case "3": pick(Number(e.key) - 1); break;
              case "x": decide(box.value, "illegible"); break;
              case "e": case "Enter": box.focus(); box.setSelectionRange(box.value.length, box.value.length); break;
              case "u":
                delete state.edits[key(lines[state.current])];
                box.value = lines[state.current].t;
                status(state.current); updateProgress(); save();
                break;
              case "d": exportTsv(); break;
              default: return;
            }
            e.preventDefault();
          });
          renderUpTo(CHUNK);
          updateProgress();
          if (lines.length) go(state.current);
          else list.prepend(el("p", "empty", "No lines to check: the run flagged none (use --all to see every line)."));
        })();

        """;
}
