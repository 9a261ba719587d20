/* tablegen reference site: copy buttons and the jump box.
 *
 * Everything here works on pages opened straight from disk (file://): no
 * request is made, the jump box builds page names and anchors itself, the
 * same way the site generator does.  The pages read fine without this script.
 */
(function () {
  "use strict";

  // Ranges of this build, written in by the generator:
  // {"families": {"cg": [min 2j, max 2j], ...}, "pages": {"6j": [paths], "9j": [paths]}}
  var BUILD = {"families":{"3j":[0,8],"6j":[0,8],"9j":[0,4],"cg":[0,8]},"pages":{"6j":["6j/jmax-0.html","6j/jmax-0.5.html","6j/jmax-1.html","6j/jmax-1.5.html","6j/jmax-2.html","6j/jmax-2.5.html","6j/jmax-3.html","6j/jmax-3.5.html","6j/jmax-4.html","6j/jmax-4.5.html","6j/jmax-5.html","6j/jmax-5.5.html","6j/jmax-6.html"],"9j":["9j/jmax-0.html","9j/jmax-0.5.html","9j/jmax-1.html","9j/jmax-1.5.html","9j/jmax-2.html"]}};

  var doc = document;
  var html = doc.documentElement;
  var ROOT = html.getAttribute("data-root") || "";
  var HERE = html.getAttribute("data-page") || "";
  var NOTE_KEY = "tablegen-jump";
  html.className += " js";

  // ---------------------------------------------------------------- copying
  function copyText(text, done) {
    function fallback() {
      var area = doc.createElement("textarea");
      area.value = text;
      area.setAttribute("readonly", "");
      area.style.position = "fixed";
      area.style.top = "-100px";
      area.style.opacity = "0";
      doc.body.appendChild(area);
      area.select();
      var ok = false;
      try { ok = doc.execCommand("copy"); } catch (e) { ok = false; }
      doc.body.removeChild(area);
      done(ok);
    }
    if (navigator.clipboard && navigator.clipboard.writeText) {
      navigator.clipboard.writeText(text).then(function () { done(true); }, fallback);
    } else {
      fallback();
    }
  }

  function copyButton(label, title, getText) {
    var b = doc.createElement("button");
    b.type = "button";
    b.className = "cp";
    b.textContent = label;
    b.title = title;
    b.addEventListener("click", function (ev) {
      ev.preventDefault();
      ev.stopPropagation();
      copyText(getText(), function (ok) {
        b.textContent = ok ? "Copied" : "Copy failed";
        b.classList.toggle("ok", ok);
        setTimeout(function () { b.textContent = label; b.classList.remove("ok"); }, 1400);
      });
    });
    return b;
  }

  // The LaTeX of a coupled state |J M> = sum <j1 m1; j2 m2|J M> |j1,m1>|j2,m2>,
  // made from the LaTeX of the coefficients in its grid row (each cell's data-t).
  function ketLatex(li) {
    var state = /^ket:J=([^,]+),M=(.+)$/.exec(li.id);
    var link = doc.querySelector('a[href="#' + li.id + '"]');
    var row = link.closest("tr");
    var j = row.closest("table").getAttribute("data-j").split(",");
    var tM = doubled(state[2], "M");
    var out = "|" + state[1] + "," + state[2] + "\\rangle = ";
    var first = true;
    var cells = row.querySelectorAll("td[data-t]");
    for (var i = 0; i < cells.length; i++) {
      var tex = cells[i].getAttribute("data-t");
      if (tex === "0") continue;
      var negative = tex.charAt(0) === "-";
      var size = negative ? tex.slice(1) : tex;
      var tm1 = doubled(/,m1=(.+)$/.exec(cells[i].id)[1], "m1");
      out += first ? (negative ? "-" : "") : (negative ? " - " : " + ");
      out += (size === "1" ? "" : size + "\\,") +
        "|" + j[0] + "," + half(tm1) + "\\rangle|" + j[1] + "," + half(tM - tm1) + "\\rangle";
      first = false;
    }
    return out;
  }

  function addCopyButtons() {
    var i, el, nodes = doc.querySelectorAll("[data-t]");
    for (i = 0; i < nodes.length; i++) {
      el = nodes[i];
      var tex = el.getAttribute("data-t");
      if (!tex) continue;
      var isCode = el.tagName === "CODE";
      var b = copyButton(isCode ? "Copy" : "TeX", isCode ? "Copy" : "Copy LaTeX: " + tex,
        (function (t) { return function () { return t; }; })(tex));
      if (isCode) el.parentNode.appendChild(b); else el.appendChild(b);
    }
    nodes = doc.querySelectorAll(".kets li[id]");
    for (i = 0; i < nodes.length; i++) {
      el = nodes[i];
      el.appendChild(copyButton("TeX", "Copy this state's expansion as LaTeX",
        (function (li) { return function () { return ketLatex(li); }; })(el)));
    }
    nodes = doc.querySelectorAll("pre.copy");
    for (i = 0; i < nodes.length; i++) {
      el = nodes[i];
      el.parentNode.insertBefore(copyButton("Copy", "Copy this text",
        (function (p) { return function () { return p.textContent; }; })(el)), el.nextSibling);
    }
  }

  // ------------------------------------------------------ quantum numbers
  // Doubled integers throughout, as in the generator: 3/2 -> 3, -1 -> -2.
  function InputError(message) { this.message = message; }

  function doubled(text, name) {
    var s = String(text).replace(/\u2212/g, "-").replace(/\s+/g, "");
    var m;
    if (s === "") throw new InputError(name + " is empty");
    m = /^([+-]?)(\d+)\/(\d+)$/.exec(s);
    if (m) {
      var num = parseInt(m[2], 10), den = parseInt(m[3], 10);
      if (den === 0 || (2 * num) % den !== 0) {
        throw new InputError(name + " = " + text + " is not a multiple of 1/2");
      }
      return (m[1] === "-" ? -1 : 1) * (2 * num) / den;
    }
    m = /^([+-]?)(\d*)(?:\.(\d*))?$/.exec(s);
    if (m && (m[2] || m[3])) {
      var whole = parseInt(m[2] || "0", 10), frac = (m[3] || "").replace(/0+$/, "");
      var t;
      if (frac === "") t = 2 * whole;
      else if (frac === "5") t = 2 * whole + 1;
      else throw new InputError(name + " = " + text + " is not a multiple of 1/2");
      return m[1] === "-" ? -t : t;
    }
    throw new InputError(name + " = " + text + " is not a number (write 3/2, 1.5, -1/2 or 2)");
  }

  function half(t) { return t % 2 === 0 ? String(t / 2) : t + "/2"; }
  function nice(t) { return half(t).replace("-", "\u2212"); }
  function fileCode(t) { return t % 2 === 0 ? String(t / 2) : Math.floor(t / 2) + ".5"; }

  function triadRule(a, b, c, names) {
    if ((a + b + c) % 2 !== 0) return names + " do not add up to an integer";
    if (c < Math.abs(a - b) || c > a + b) return names + " break the triangle rule";
    return null;
  }

  function inRange(fam, list) {
    var r = BUILD.families[fam];
    for (var i = 0; i < list.length; i++) if (list[i] < r[0] || list[i] > r[1]) return false;
    return true;
  }

  function rangeText(fam) {
    var r = BUILD.families[fam];
    return r[0] === 0 ? "j \u2264 " + nice(r[1]) : nice(r[0]) + " \u2264 j \u2264 " + nice(r[1]);
  }

  function greater(x, y) {
    for (var i = 0; i < x.length; i++) if (x[i] !== y[i]) return x[i] > y[i];
    return false;
  }

  function permutations(list) {
    if (list.length <= 1) return [list.slice()];
    var out = [];
    for (var i = 0; i < list.length; i++) {
      var rest = list.slice(0, i).concat(list.slice(i + 1));
      var sub = permutations(rest);
      for (var k = 0; k < sub.length; k++) out.push([list[i]].concat(sub[k]));
    }
    return out;
  }

  function symbolAnchor(key) {
    var parts = [];
    for (var i = 0; i < key.length; i += 3) parts.push([half(key[i]), half(key[i + 1]), half(key[i + 2])].join(","));
    return parts.join(";");
  }

  function symbolText(key) {
    var parts = [];
    for (var i = 0; i < key.length; i += 3) parts.push([nice(key[i]), nice(key[i + 1]), nice(key[i + 2])].join(" "));
    return "{" + parts.join("; ") + "}";
  }

  // 6j: the class is every form with the same triad sums and quadrangle sums
  // (in any order); the canonical form is the largest.
  function sixjFromSums(al, be) {
    return [
      (be[0] - al[3]) + (be[1] - al[2]),
      (be[0] - al[3]) + (be[2] - al[1]),
      (be[1] - al[2]) + (be[2] - al[1]),
      (be[0] - al[0]) + (be[1] - al[1]),
      (be[0] - al[0]) + (be[2] - al[2]),
      (be[1] - al[0]) + (be[2] - al[3])
    ];
  }

  function sixjMembers(t) {
    var a = t[0], b = t[1], c = t[2], d = t[3], e = t[4], f = t[5];
    var al = [(a + b + c) / 2, (a + e + f) / 2, (d + b + f) / 2, (d + e + c) / 2];
    var be = [(a + b + d + e) / 2, (a + c + d + f) / 2, (b + c + e + f) / 2];
    var pa = permutations(al), pb = permutations(be), out = [];
    for (var i = 0; i < pa.length; i++) for (var k = 0; k < pb.length; k++) out.push(sixjFromSums(pa[i], pb[k]));
    return out;
  }

  function largest(list) {
    var best = list[0];
    for (var i = 1; i < list.length; i++) if (greater(list[i], best)) best = list[i];
    return best;
  }

  var PERMS3 = [[0, 1, 2, 0], [0, 2, 1, 1], [1, 0, 2, 1], [1, 2, 0, 0], [2, 0, 1, 0], [2, 1, 0, 1]];

  // 9j: row and column permutations and the transpose; an odd permutation
  // brings the sign (-1)^(sum of the nine j).  Returns [forms, signs].
  function ninejMembers(t) {
    var oddSign = ((t.reduce(function (s, x) { return s + x; }, 0) / 2) % 2 === 0) ? 1 : -1;
    var forms = [], signs = [], seen = {};
    function add(m, sign) {
      var k = m.join(" ");
      if (seen.hasOwnProperty(k)) return;
      seen[k] = true;
      forms.push(m);
      signs.push(sign);
    }
    for (var r = 0; r < 6; r++) {
      for (var c = 0; c < 6; c++) {
        var rp = PERMS3[r], cp = PERMS3[c];
        var sign = (rp[3] + cp[3]) % 2 ? oddSign : 1;
        var m = [], tr = [];
        for (var i = 0; i < 3; i++) for (var k = 0; k < 3; k++) m.push(t[3 * rp[i] + cp[k]]);
        for (i = 0; i < 3; i++) for (k = 0; k < 3; k++) tr.push(m[3 * k + i]);
        add(m, sign);
        add(tr, sign);
      }
    }
    return [forms, signs];
  }

  // ------------------------------------------------------------ families
  var FAMILIES = {
    cg: {
      label: "Clebsch\u2013Gordan \u27e8j1 m1; j2 m2 | J M\u27e9", data: "cg",
      names: ["j1", "m1", "j2", "m2", "J", "M"],
      shape: ["\u27e8", 0, 1, ";", 2, 3, "|", 4, 5, "\u27e9"]
    },
    "3j": {
      label: "Wigner 3j (j1 j2 j3; m1 m2 m3)", data: "3j",
      names: ["j1", "j2", "j3", "m1", "m2", "m3"],
      shape: ["(", 0, 1, 2, ";", 3, 4, 5, ")"]
    },
    "6j": {
      label: "Wigner 6j {j1 j2 j3; j4 j5 j6}", data: "6j",
      names: ["j1", "j2", "j3", "j4", "j5", "j6"],
      shape: ["{", 0, 1, 2, ";", 3, 4, 5, "}"]
    },
    w: {
      label: "Racah W(a b c d; e f)", data: "6j",
      names: ["a", "b", "c", "d", "e", "f"],
      shape: ["W(", 0, 1, 2, 3, ";", 4, 5, ")"]
    },
    "9j": {
      label: "Wigner 9j {j11 j12 j13; j21 \u2026 j33}", data: "9j",
      names: ["j11", "j12", "j13", "j21", "j22", "j23", "j31", "j32", "j33"],
      shape: ["{", 0, 1, 2, ";", 3, 4, 5, ";", 6, 7, 8, "}"]
    }
  };

  function result(kind, text, path, anchor) {
    return { kind: kind, text: text, path: path || null, anchor: anchor || null };
  }
  function zero(text) { return result("zero", "Zero: " + text + ", so it is not tabulated."); }

  function notInBuild(fam, what) {
    if (!BUILD.families[fam]) return result("bad", what + " are not part of this build.");
    return null;
  }

  function checkJs(names, t, idx) {
    for (var i = 0; i < idx.length; i++) {
      if (t[idx[i]] < 0) throw new InputError(names[idx[i]] + " must be \u2265 0");
    }
  }

  function checkProjection(names, t, ij, im) {
    if ((t[ij] - t[im]) % 2 !== 0) {
      throw new InputError(names[ij] + " \u2212 " + names[im] + " must be an integer (" + names[ij] + " = " + nice(t[ij]) + ")");
    }
    if (Math.abs(t[im]) > t[ij]) return "|" + names[im] + "| > " + names[ij];
    return null;
  }

  function resolveCG(t) {
    var n = FAMILIES.cg.names, why;
    checkJs(n, t, [0, 2, 4]);
    why = checkProjection(n, t, 0, 1) || checkProjection(n, t, 2, 3) || checkProjection(n, t, 4, 5);
    if (why) return zero(why);
    if (t[1] + t[3] !== t[5]) return zero("m1 + m2 \u2260 M (the m's do not add up)");
    why = triadRule(t[0], t[2], t[4], "j1, j2, J");
    if (why) return zero(why);
    var missing = notInBuild("cg", "Clebsch\u2013Gordan coefficients");
    if (missing) return missing;
    if (!inRange("cg", [t[0], t[2]])) return result("bad", "j1 and j2 must be in this build's range " + rangeText("cg") + ".");
    return result("ok", "", "cg/" + fileCode(t[0]) + "x" + fileCode(t[2]) + ".html",
      "J=" + half(t[4]) + ",M=" + half(t[5]) + ",m1=" + half(t[1]));
  }

  function resolve3j(t) {
    var n = FAMILIES["3j"].names, why;
    checkJs(n, t, [0, 1, 2]);
    why = checkProjection(n, t, 0, 3) || checkProjection(n, t, 1, 4) || checkProjection(n, t, 2, 5);
    if (why) return zero(why);
    if (t[3] + t[4] + t[5] !== 0) return zero("m1 + m2 + m3 \u2260 0 (the m's do not add up)");
    why = triadRule(t[0], t[1], t[2], "j1, j2, j3");
    if (why) return zero(why);
    var missing = notInBuild("3j", "3j symbols");
    if (missing) return missing;
    if (!inRange("3j", [t[0], t[1]])) return result("bad", "j1 and j2 must be in this build's range " + rangeText("3j") + ".");
    return result("ok", "", "3j/" + fileCode(t[0]) + "x" + fileCode(t[1]) + ".html",
      "j3=" + half(t[2]) + ",m3=" + half(t[5]) + ",m1=" + half(t[3]));
  }

  function sixjTarget(t, what, sign) {
    var a = t[0], b = t[1], c = t[2], d = t[3], e = t[4], f = t[5], why;
    why = triadRule(a, b, c, "(j1, j2, j3)") || triadRule(a, e, f, "(j1, j5, j6)") ||
      triadRule(d, b, f, "(j4, j2, j6)") || triadRule(d, e, c, "(j4, j5, j3)");
    if (why) return zero(why);
    var missing = notInBuild("6j", "6j symbols and Racah W");
    if (missing) return missing;
    var forms = sixjMembers(t), any = false;
    for (var i = 0; i < forms.length; i++) if (inRange("6j", forms[i])) { any = true; break; }
    if (!any) return result("bad", "No form of this 6j has every j in this build's range " + rangeText("6j") + ".");
    var canon = largest(forms);
    var path = "6j/jmax-" + fileCode(canon[0]) + ".html";
    if (BUILD.pages["6j"].indexOf(path) < 0) return result("bad", "This 6j is not part of this build.");
    var text = "";
    if (what) {
      text = what + " = " + (sign < 0 ? "\u22121 \u00d7 " : "") + symbolText(t) +
        (canon.join() === t.join() ? "" : " = " + (sign < 0 ? "\u22121 \u00d7 " : "") + "the canonical form " + symbolText(canon)) + ".";
    } else if (canon.join() !== t.join()) {
      text = symbolText(t) + " equals its canonical form " + symbolText(canon) + ", shown highlighted.";
    }
    return result("ok", text, path, symbolAnchor(canon));
  }

  function resolve6j(t) {
    checkJs(FAMILIES["6j"].names, t, [0, 1, 2, 3, 4, 5]);
    return sixjTarget(t, "", 1);
  }

  function resolveW(t) {
    checkJs(FAMILIES.w.names, t, [0, 1, 2, 3, 4, 5]);
    var a = t[0], b = t[1], c = t[2], d = t[3], e = t[4], f = t[5];
    var sign = ((a + b + c + d) / 2) % 2 === 0 ? 1 : -1;  // a+b+c+d is whole once the triads hold
    var why = triadRule(a, b, e, "(a, b, e)") || triadRule(c, d, e, "(c, d, e)") ||
      triadRule(a, c, f, "(a, c, f)") || triadRule(b, d, f, "(b, d, f)");
    if (why) return zero(why);
    var what = "W(" + [nice(a), nice(b), nice(c), nice(d)].join(" ") + "; " + nice(e) + " " + nice(f) + ")";
    return sixjTarget([a, b, e, d, c, f], what, sign);
  }

  function resolve9j(t) {
    var n = FAMILIES["9j"].names, why, i;
    checkJs(n, t, [0, 1, 2, 3, 4, 5, 6, 7, 8]);
    for (i = 0; i < 3 && !why; i++) {
      why = triadRule(t[3 * i], t[3 * i + 1], t[3 * i + 2], "the entries of row " + (i + 1)) ||
        triadRule(t[i], t[i + 3], t[i + 6], "the entries of column " + (i + 1));
    }
    if (why) return zero(why);
    var missing = notInBuild("9j", "9j symbols");
    if (missing) return missing;
    if (!inRange("9j", t)) return result("bad", "Every j must be in this build's range " + rangeText("9j") + ".");
    var both = ninejMembers(t), forms = both[0], signs = both[1];
    var best = 0;
    for (i = 1; i < forms.length; i++) if (greater(forms[i], forms[best])) best = i;
    var canon = forms[best], sign = signs[best];
    var path = "9j/jmax-" + fileCode(canon[0]) + ".html";
    if (BUILD.pages["9j"].indexOf(path) < 0) return result("bad", "This 9j is not part of this build.");
    var text = "";
    if (canon.join() !== t.join()) {
      text = symbolText(t) + " = " + (sign < 0 ? "\u22121 \u00d7 " : "") + "its canonical form " + symbolText(canon) + ", shown highlighted.";
    }
    return result("ok", text, path, symbolAnchor(canon));
  }

  var RESOLVE = { cg: resolveCG, "3j": resolve3j, "6j": resolve6j, w: resolveW, "9j": resolve9j };

  // ------------------------------------------------------------ the box
  function remember(state) {
    try { sessionStorage.setItem(NOTE_KEY, JSON.stringify(state)); } catch (e) { /* storage off */ }
  }
  function recall() {
    try { return JSON.parse(sessionStorage.getItem(NOTE_KEY) || "null"); } catch (e) { return null; }
  }

  // The note about a jump (sign, canonical form) floats at the bottom of the
  // window, where it is seen next to the highlighted value, until closed.
  function showBanner(text) {
    var old = doc.getElementById("jump-note");
    if (old) old.parentNode.removeChild(old);
    if (!text) return;
    var note = doc.createElement("div");
    note.id = "jump-note";
    note.className = "banner";
    note.setAttribute("role", "status");
    var p = doc.createElement("p");
    p.textContent = text;
    var close = doc.createElement("button");
    close.type = "button";
    close.textContent = "\u00d7";
    close.title = "Close";
    close.setAttribute("aria-label", "Close");
    close.addEventListener("click", function () { note.parentNode.removeChild(note); });
    note.appendChild(p);
    note.appendChild(close);
    doc.body.appendChild(note);
  }

  function buildBox(box) {
    var form = doc.createElement("form");
    form.setAttribute("role", "search");
    form.setAttribute("aria-label", "Jump to a value");
    var label = doc.createElement("label");
    label.textContent = "Go to ";
    var select = doc.createElement("select");
    select.setAttribute("aria-label", "Family");
    Object.keys(FAMILIES).forEach(function (key) {
      var fam = FAMILIES[key];
      if (!BUILD.families[fam.data]) return;
      var o = doc.createElement("option");
      o.value = key;
      o.textContent = fam.label;
      select.appendChild(o);
    });
    label.appendChild(select);
    var sym = doc.createElement("span");
    sym.className = "sym";
    var go = doc.createElement("button");
    go.type = "submit";
    go.textContent = "Go";
    var out = doc.createElement("output");
    out.setAttribute("aria-live", "polite");
    form.appendChild(label);
    form.appendChild(sym);
    form.appendChild(go);
    form.appendChild(out);
    box.appendChild(form);

    var inputs = [];
    function layout(values) {
      var fam = FAMILIES[select.value];
      sym.textContent = "";
      inputs = [];
      fam.shape.forEach(function (part) {
        if (typeof part === "string") {
          var b = doc.createElement("b");
          b.textContent = part;
          sym.appendChild(b);
          return;
        }
        var input = doc.createElement("input");
        input.type = "text";
        input.inputMode = "text";
        input.autocomplete = "off";
        input.spellcheck = false;
        input.placeholder = fam.names[part];
        input.setAttribute("aria-label", fam.names[part]);
        input.name = fam.names[part];
        if (values && values[part] !== undefined) input.value = values[part];
        input.addEventListener("input", spread);
        sym.appendChild(input);
        inputs[part] = input;
      });
    }

    // Typing or pasting several numbers into one field fills the next ones.
    function spread(ev) {
      var input = ev.target, parts = input.value.trim().split(/[\s,;]+/);
      if (parts.length < 2) return;
      var at = inputs.indexOf(input);
      for (var i = 0; i < parts.length && at + i < inputs.length; i++) inputs[at + i].value = parts[i];
      inputs[Math.min(at + parts.length, inputs.length) - 1].focus();
    }

    select.addEventListener("change", function () { layout(null); out.textContent = ""; });

    form.addEventListener("submit", function (ev) {
      ev.preventDefault();
      out.className = "";
      out.textContent = "";
      var fam = select.value, values = inputs.map(function (i) { return i.value; }), res;
      try {
        var t = values.map(function (v, i) { return doubled(v, FAMILIES[fam].names[i]); });
        res = RESOLVE[fam](t);
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
        res = result("bad", e.message + ".");
      }
      if (res.kind !== "ok") {
        out.className = res.kind;
        out.textContent = res.text;
        return;
      }
      remember({ fam: fam, values: values, to: res.path + "#" + res.anchor, note: res.text });
      if (res.path === HERE) {
        if (location.hash === "#" + res.anchor) {
          var el = doc.getElementById(res.anchor);
          if (el) el.scrollIntoView();
        } else {
          location.hash = res.anchor;
        }
        showBanner(res.text);
      } else {
        location.href = ROOT + res.path + "#" + res.anchor;
      }
    });

    // Start with the family of this page; keep the last typed numbers if they fit it.
    var state = recall();
    var kind = doc.body.className;
    var fam = FAMILIES[kind] && BUILD.families[kind] ? kind : null;
    if (state && FAMILIES[state.fam] && BUILD.families[FAMILIES[state.fam].data] &&
        (!fam || FAMILIES[state.fam].data === kind)) {
      fam = state.fam;
    }
    if (fam) select.value = fam;
    layout(state && state.fam === select.value ? state.values : null);
    if (state && state.note && state.to === HERE + decodeURIComponent(location.hash)) showBanner(state.note);
    box.hidden = false;

    // "/" focuses the box from anywhere on the page.
    doc.addEventListener("keydown", function (ev) {
      var tag = (ev.target && ev.target.tagName) || "";
      if (ev.key === "/" && tag !== "INPUT" && tag !== "TEXTAREA" && tag !== "SELECT") {
        ev.preventDefault();
        inputs[0].focus();
        box.scrollIntoView();
      }
    });
  }

  function start() {
    addCopyButtons();
    var box = doc.getElementById("jump");
    if (box && BUILD) buildBox(box);
  }

  if (doc.readyState === "loading") doc.addEventListener("DOMContentLoaded", start);
  else start();
})();
