/* tablegen reference site: copy buttons and the jump box.
 *
 * Everything here works on pages opened straight from disk (file://): no
 * request is made.  What the jump box must know -- the kinds of value with
 * their argument names, selection rules and notation, the families with their
 * layouts, ranges, page-name and anchor patterns -- is written into every page
 * by the generator, from its records, as assets/data.js (window.tablegenData).  This
 * script keeps only the parsing of typed numbers and the symmetry algorithms
 * that find the canonical form of a typed symbol.  The pages read fine without it.
 */
(function () {
  "use strict";

  var doc = document;
  var html = doc.documentElement;
  var ROOT = html.getAttribute("data-root") || "";
  var HERE = html.getAttribute("data-page") || "";
  var NOTE_KEY = "tablegen-jump";
  var DATA = readData();
  html.className += " js";

  // assets/data.js, loaded just before this script, sets window.tablegenData.
  function readData() {
    var data = window.tablegenData;
    return data && data.kinds ? data : null;
  }

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

  // The LaTeX of a coupled state |(j1,j2) J,M> = sum <j1 m1; j2 m2|J M> |j1,m1>|j2,m2>,
  // made from the LaTeX of the coefficients in its grid row (each cell's data-t).
  // The row's id is "<tag>:<third>=<value>,<row>=<value>", as the grid layout writes it.
  function ketLatex(li) {
    var state = /^[^:]+:[^=]+=([^,]+),([^=]+)=(.+)$/.exec(li.id);
    var link = doc.querySelector('a[href="#' + li.id + '"]');
    var row = link.closest("tr");
    var j = row.closest("table").getAttribute("data-j").split(",");
    var tM = doubled(state[3], state[2]);
    var out = "|(" + j[0] + "," + j[1] + ")\\," + state[1] + "," + state[3] + "\\rangle = ";
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

  // The name=value pairs of a cell id such as "J=2,M=-1,m1=0".
  function cellValues(id) {
    var values = {}, pairs = id.split(/[,;]/), i, kv;
    for (i = 0; i < pairs.length; i++) {
      kv = pairs[i].split("=");
      if (kv.length === 2) values[kv[0]] = kv[1];
    }
    return values;
  }

  // A table's data-twin is one link for all its cells: @name@ is the cell's value of that
  // name, @-name@ its negative (the same rule as the build's link check, cellpattern.py).
  function twinHref(pattern, id) {
    var values = cellValues(id), missing = false;
    var href = pattern.replace(/@(-?)([^@]+)@/g, function (all, minus, name) {
      if (!(name in values)) { missing = true; return ""; }
      var v = values[name];
      if (!minus || v === "0") return v;
      return v.charAt(0) === "-" ? v.slice(1) : "-" + v;
    });
    return missing ? null : href;
  }

  function addTwinLinks() {
    var tables = doc.querySelectorAll("table[data-twin]"), i, k, cells, a, href;
    for (i = 0; i < tables.length; i++) {
      cells = tables[i].querySelectorAll("td[id]");
      for (k = 0; k < cells.length; k++) {
        href = twinHref(tables[i].getAttribute("data-twin"), cells[k].id);
        if (!href) continue;
        a = doc.createElement("a");
        a.href = href;
        a.textContent = tables[i].getAttribute("data-twin-label");
        cells[k].appendChild(a);
      }
    }
  }

  // "symbol = value" in LaTeX for a value.  A classes row gives the whole text (data-e on
  // the cell); a grid or matrix table gives its symbol with @name@ for each argument that
  // a cell's id (name=value pairs) or its corner note (the table's data-note) supplies.
  function equationLatex(el) {
    var own = el.getAttribute("data-e");
    if (own) return own;
    var table = el.closest("table[data-e]");
    if (!table || !el.id) return null;
    var values = cellValues(el.id);
    var note = table.getAttribute("data-note"), v = el.querySelector("var");
    if (note && v) values[note] = v.textContent.replace(/\u2212/g, "-");
    var missing = false;
    var symbol = table.getAttribute("data-e").replace(/@([^@]+)@/g, function (all, name) {
      if (!(name in values)) missing = true;
      return values[name];
    });
    return missing ? null : symbol + " = " + el.getAttribute("data-t");
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
      var eq = isCode ? null : equationLatex(el);
      if (eq) {
        b = copyButton("TeX =", "Copy LaTeX of symbol = value: " + eq,
          (function (t) { return function () { return t; }; })(eq));
        b.classList.add("eq");
        el.appendChild(b);
      }
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

  function rangeText(fam) {
    var r = fam.range;
    return r[0] === 0 ? "j \u2264 " + nice(r[1]) : nice(r[0]) + " \u2264 j \u2264 " + nice(r[1]);
  }

  function inRange(fam, list) {
    for (var i = 0; i < list.length; i++) if (list[i] < fam.range[0] || list[i] > fam.range[1]) return false;
    return true;
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

  // A symbol in the kind's notation: open, groups joined by their separators, close.
  function writeSymbol(kind, t) {
    var out = kind.open;
    for (var g = 0; g < kind.groups.length; g++) {
      if (g) out += kind.seps[g - 1];
      out += kind.groups[g].map(function (i) { return nice(t[i]); }).join(" ");
    }
    return out + kind.close;
  }

  // The id of a class row: the kind's groups, entries joined by ",", groups by ";".
  function classAnchor(kind, t) {
    return kind.groups.map(function (g) {
      return g.map(function (i) { return half(t[i]); }).join(",");
    }).join(";");
  }

  // Fill "{name}" in a page or anchor pattern from the named doubled values.
  function fill(pattern, named, format) {
    return pattern.replace(/\{([^}]+)\}/g, function (_, name) { return format(named[name]); });
  }

  // ------------------------------------------------ symmetry classes
  // Each returns [forms, signs] with value(form) = sign * value(t).
  // 6j: the class is every form with the same triad sums and quadrangle sums
  // (in any order), all equal (tetrahedral and Regge symmetries).
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
    var pa = permutations(al), pb = permutations(be), forms = [], signs = [];
    for (var i = 0; i < pa.length; i++) {
      for (var k = 0; k < pb.length; k++) { forms.push(sixjFromSums(pa[i], pb[k])); signs.push(1); }
    }
    return [forms, signs];
  }

  var PERMS3 = [[0, 1, 2, 0], [0, 2, 1, 1], [1, 0, 2, 1], [1, 2, 0, 0], [2, 0, 1, 0], [2, 1, 0, 1]];

  // 9j: row and column permutations and the transpose; an odd permutation
  // brings the sign (-1)^(sum of the nine j).
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

  // Named after the Python function each one mirrors (the kind's "members").
  // 6j ordinary (tetrahedral) symmetries: permute the columns, and exchange upper
  // and lower entries in two of them; all forms equal.
  function sixjTetrahedralMembers(t) {
    var cols = [[t[0], t[3]], [t[1], t[4]], [t[2], t[5]]], flips = [[0, 0, 0], [1, 1, 0], [1, 0, 1], [0, 1, 1]];
    var forms = [], signs = [];
    permutations(cols).forEach(function (p) {
      flips.forEach(function (fl) {
        var c = p.map(function (col, i) { return fl[i] ? [col[1], col[0]] : col; });
        forms.push([c[0][0], c[1][0], c[2][0], c[0][1], c[1][1], c[2][1]]);
        signs.push(1);
      });
    });
    return [forms, signs];
  }

  var MEMBERS = { sixj_members: sixjMembers, ninej_members: ninejMembers,
    sixj_tetrahedral_members: sixjTetrahedralMembers };

  // ------------------------------------------------------------ finding
  var KINDS = {}, KIND_ORDER = [];
  if (DATA) DATA.kinds.forEach(function (k) { KINDS[k.id] = k; KIND_ORDER.push(k.id); });

  // factor: value(typed symbol) = factor * value(the highlighted row or cell).
  function result(kind, text, path, anchor, factor) {
    return { kind: kind, text: text, path: path || null, anchor: anchor || null, factor: factor || 1 };
  }
  function zero(text) { return result("zero", "Zero: " + text + ", so it is not tabulated."); }
  function minusOne(sign) { return sign < 0 ? "\u22121 \u00d7 " : ""; }

  // The selection rules of a kind, from its lists: the j's, each (j, m) pair,
  // the projection sum and the triads.  Returns the reason for a zero, or null.
  function selectionRule(k, t) {
    var n = k.names, i, why;
    for (i = 0; i < k.js.length; i++) {
      if (t[k.js[i]] < 0) throw new InputError(n[k.js[i]] + " must be \u2265 0");
    }
    for (i = 0; i < k.pairs.length; i++) {
      var ij = k.pairs[i][0], im = k.pairs[i][1];
      if ((t[ij] - t[im]) % 2 !== 0) {
        throw new InputError(n[ij] + " \u2212 " + n[im] + " must be an integer (" + n[ij] + " = " + nice(t[ij]) + ")");
      }
      if (Math.abs(t[im]) > t[ij]) return "|" + n[im] + "| > " + n[ij];
    }
    if (k.msum.length) {
      var total = 0, terms = [];
      for (i = 0; i < k.msum.length; i++) {
        if (!k.msum[i]) continue;
        total += k.msum[i] * t[i];
        terms.push((k.msum[i] < 0 ? "\u2212 " : terms.length ? "+ " : "") + n[i]);
      }
      if (total !== 0) return terms.join(" ") + " \u2260 0 (the m's do not add up)";
    }
    for (i = 0; i < k.triads.length; i++) {
      var p = k.triads[i], a = t[p[0]], b = t[p[1]], c = t[p[2]];
      var names = n[p[0]] + ", " + n[p[1]] + ", " + n[p[2]];
      if ((a + b + c) % 2 !== 0) return names + " " + DATA.texts["triad-sum"];
      if (c < Math.abs(a - b) || c > a + b) return names + " " + DATA.texts.triangle;
    }
    return null;
  }

  // A form the pages file under another (fam.exchange: when one argument exceeds another, the pairs
  // exchanged, times (-1)^(constant + half the sum of the phase arguments)): the filed form and its sign.
  function exchanged(fam, named) {
    var ex = fam.exchange;
    if (!ex || named[ex.when[0]] <= named[ex.when[1]]) return null;
    var s = 2 * ex.constant, out = {};
    ex.phase.forEach(function (name) { s += named[name]; });
    Object.keys(named).forEach(function (name) { out[name] = named[name]; });
    ex.pairs.forEach(function (p) { out[p[0]] = named[p[1]]; out[p[1]] = named[p[0]]; });
    return { named: out, sign: (s / 2) % 2 === 0 ? 1 : -1 };
  }

  // grid and matrix layouts: page and anchor follow from the arguments by name.
  function patternTarget(fam, k, t) {
    var named = {}, text = "", sign = 1;
    k.names.forEach(function (name, i) { named[name] = t[i]; });
    var params = fam.params.map(function (name) { return named[name]; });
    if (!inRange(fam, params)) {
      return result("bad", fam.params.join(" and ") + " must be in this build's range " + rangeText(fam) + ".");
    }
    var typed = named, other = exchanged(fam, named);
    if (other) {
      named = other.named;
      sign = other.sign;
      var filed = k.names.map(function (name) { return named[name]; });
      var swaps = fam.exchange.pairs.map(function (p) { return p[0] + " \u2194 " + p[1]; }).join(", ");
      text = "Filed as " + writeSymbol(k, filed) + " (" + swaps + "; highlighted)" +
        (sign < 0 ? ", which is \u22121 \u00d7 the symbol above." : ", which is equal to it.");
    }
    var page = fam.page;  // a pair too large for one page has a page per third j
    if (fam.split && fam.split.indexOf(named.j1 + "," + named.j2) >= 0) page = fam.splitPage;
    var path = fill(page, named, fileCode);
    if (fam.paths && fam.paths.indexOf(path) < 0) {
      var which = page.match(/\{\w+\}/g).map(function (b) {  // the names the page is named by
        var name = b.slice(1, -1);
        return name + " = " + nice(typed[name]);
      }).join(", ");
      return result("bad", "This build has no " + fam.title + " page for " + which + ".");
    }
    return result("ok", text, path, fill(fam.anchor, named, half), sign);
  }

  // classes layout: a form of the symbol with every j in range (any symmetry of
  // the kind, "members"), then the largest form of its ordinary class ("filed"):
  // the row it is filed under; its page is the last whose first form is not larger.
  function classTarget(fam, k, t, what, sign) {
    var both = MEMBERS[fam.members](t), forms = both[0], signs = both[1], i, at = -1;
    if (inRange(fam, t)) at = forms.map(function (f) { return f.join(); }).indexOf(t.join());
    for (i = 0; at < 0 && i < forms.length; i++) if (inRange(fam, forms[i])) at = i;
    if (at < 0) return result("bad", "No form of this " + k.key + " has every j in this build's range " + rangeText(fam) + ".");
    var own = MEMBERS[fam.filed](forms[at]), best = 0;
    for (i = 1; i < own[0].length; i++) if (greater(own[0][i], own[0][best])) best = i;
    var canon = own[0][best], total = sign * signs[at] * own[1][best];
    var path = null;
    for (i = 0; i < fam.pages.length; i++) if (!greater(fam.pages[i][1], canon)) path = fam.pages[i][0];
    if (!path) return result("bad", "This " + k.key + " is not part of this build.");
    var same = canon.join() === t.join(), text = "";
    if (what) {
      text = what + " = " + minusOne(sign) + writeSymbol(k, t) +
        (same ? "" : " = " + minusOne(total) + writeSymbol(k, canon)) + " (highlighted row).";
    } else if (!same) {
      text = "Filed under " + writeSymbol(k, canon) + " (highlighted row)" +
        (total < 0 ? ", which is \u22121 \u00d7 the symbol above." : ", which is equal to it.");
    }
    return result("ok", text, path, classAnchor(k, canon), total);
  }

  function resolve(id, t) {
    var k = KINDS[id], why = selectionRule(k, t);
    if (why) return zero(why);
    var fam = DATA.families[k.family], main = null;
    KIND_ORDER.forEach(function (other) {  // the family's own kind (not a companion)
      if (!main && KINDS[other].family === k.family && !KINDS[other].map) main = KINDS[other];
    });
    var target = t, sign = 1, what = "";
    if (k.map) {  // a companion: the family's own symbol it equals, with the sign
      target = [];
      k.map.order.forEach(function (from, at) { target[from] = t[at]; });
      var s = 0;
      k.map.phase.forEach(function (i) { s += target[i]; });
      sign = (s / 2) % 2 === 0 ? 1 : -1;
      what = writeSymbol(k, t);
    }
    var res = fam.layout === "classes" ? classTarget(fam, main, target, what, sign) : patternTarget(fam, main, target);
    res.typed = writeSymbol(k, t);
    return res;
  }

  // ------------------------------------------------------------ the box
  function remember(state) {
    try { sessionStorage.setItem(NOTE_KEY, JSON.stringify(state)); } catch (e) { /* storage off */ }
  }
  function recall() {
    try { return JSON.parse(sessionStorage.getItem(NOTE_KEY) || "null"); } catch (e) { return null; }
  }

  // The value of a landing place as the page prints it: its LaTeX, its MathML, its decimal.
  function printedValue(anchor) {
    var el = doc.getElementById(anchor);
    if (!el) return null;
    var cell = el.tagName === "TD" ? el : el.querySelector("td[data-t]");
    if (!cell) return null;
    var decimal = "", small = cell.querySelector("small:not(.why)"), i;
    if (small) decimal = small.textContent;
    else for (i = 0; i < cell.childNodes.length; i++) if (cell.childNodes[i].nodeType === 3) decimal += cell.childNodes[i].textContent;
    return { tex: cell.getAttribute("data-t"), math: cell.querySelector("math"), decimal: decimal.trim() || "0" };
  }

  // factor * a printed value, as text: only the sign changes (the site prints every value sign first).
  function signedTex(tex, factor) {
    if (factor > 0 || tex === "0") return tex;
    if (tex.charAt(0) === "-") return tex.slice(1);
    return /[+-]/.test(tex) ? "-\\left(" + tex + "\\right)" : "-" + tex;
  }
  function signedDecimal(text, factor) {
    if (factor > 0 || /^[-\u2212]?0(\.0*)?$/.test(text)) return text;
    return text.charAt(0) === "-" ? text.slice(1) : "-" + text;
  }
  function signedMath(math, factor) {
    var out = math.cloneNode(true);
    if (factor > 0 || !out.firstElementChild) return out;
    var first = out.firstElementChild;
    if (first.tagName.toLowerCase() === "mo" && first.textContent === "\u2212") { out.removeChild(first); return out; }
    var minus = doc.createElementNS(out.namespaceURI, "mo");
    minus.textContent = "\u2212";
    out.insertBefore(minus, first);
    return out;
  }

  // The symbol as the reader typed it (or as a link named it), with its own
  // value, sign, decimal and LaTeX; the row it is filed under stays highlighted.
  function landing(state) {
    if (!state.typed) return null;
    var v = printedValue(state.to.split("#")[1]);
    if (!v || !v.math) return null;
    var factor = state.factor || 1, tex = signedTex(v.tex, factor);
    var p = doc.createElement("p");
    p.className = "said";
    var sym = doc.createElement("span");
    sym.className = "typed";
    sym.textContent = state.typed + " =";
    p.appendChild(sym);
    p.appendChild(doc.createTextNode(" "));
    p.appendChild(signedMath(v.math, factor));
    var dec = doc.createElement("small");
    dec.textContent = signedDecimal(v.decimal, factor);
    p.appendChild(dec);
    p.appendChild(copyButton("TeX", "Copy the LaTeX of this value: " + tex, function () { return tex; }));
    p.setAttribute("data-value", tex);
    return p;
  }

  // The note about a jump floats at the bottom of the window, where it is seen
  // next to the highlighted value, until closed.
  function showBanner(text, state) {
    var old = doc.getElementById("jump-note");
    if (old) old.parentNode.removeChild(old);
    var said = state ? landing(state) : null;
    if (!text && !said) return;
    var note = doc.createElement("div");
    note.id = "jump-note";
    note.className = "banner";
    note.setAttribute("role", "status");
    var p = doc.createElement("div");
    if (said) p.appendChild(said);
    if (text) {
      var ctx = doc.createElement("p");
      ctx.className = "ctx";
      ctx.textContent = text;
      p.appendChild(ctx);
    }
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
    KIND_ORDER.forEach(function (key) {
      var o = doc.createElement("option");
      o.value = key;
      o.textContent = KINDS[key].label;
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
      var k = KINDS[select.value];
      sym.textContent = "";
      inputs = [];
      function mark(text) {
        var b = doc.createElement("b");
        b.textContent = text.trim();
        sym.appendChild(b);
      }
      mark(k.open);
      k.groups.forEach(function (group, g) {
        if (g) mark(k.seps[g - 1]);
        group.forEach(function (part) {
          var input = doc.createElement("input");
          input.type = "text";
          input.inputMode = "text";
          input.autocomplete = "off";
          input.spellcheck = false;
          input.placeholder = k.names[part];
          input.setAttribute("aria-label", k.names[part]);
          input.name = k.names[part];
          if (values && values[part] !== undefined) input.value = values[part];
          input.addEventListener("input", spread);
          sym.appendChild(input);
          inputs[part] = input;
        });
      });
      mark(k.close);
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
        var t = values.map(function (v, i) { return doubled(v, KINDS[fam].names[i]); });
        res = resolve(fam, t);
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
        res = result("bad", e.message + ".");
      }
      if (res.kind !== "ok") {
        out.className = res.kind;
        out.textContent = res.text;
        return;
      }
      var state = { fam: fam, values: values, to: res.path + "#" + res.anchor, note: res.text,
        typed: res.typed, factor: res.factor };
      remember(state);
      if (res.path === HERE) {
        if (location.hash === "#" + res.anchor) {
          var el = doc.getElementById(res.anchor);
          if (el) el.scrollIntoView();
        } else {
          location.hash = res.anchor;
        }
        showBanner(res.text, state);
      } else {
        location.href = ROOT + res.path + "#" + res.anchor;
      }
    });

    // Start with the family of this page; keep the last typed numbers if they fit it.
    var state = recall();
    var kind = doc.body.className;
    var fam = null;
    KIND_ORDER.forEach(function (id) { if (!fam && KINDS[id].family === kind) fam = id; });
    if (state && KINDS[state.fam] && (!fam || KINDS[state.fam].family === kind)) {
      fam = state.fam;
    }
    if (fam) select.value = fam;
    layout(state && state.fam === select.value ? state.values : null);
    if (state && state.to === HERE + decodeURIComponent(location.hash)) showBanner(state.note, state);
    box.hidden = false;

    // "/" focuses the box from anywhere on the page.
    doc.addEventListener("keydown", function (ev) {
      var tag = (ev.target && ev.target.tagName) || "";
      if (ev.key === "/" && tag !== "INPUT" && tag !== "TEXTAREA" && tag !== "SELECT") {
        ev.preventDefault();
        box.parentNode.classList.add("open");  // unfold it on a narrow screen
        inputs[0].focus();
        box.scrollIntoView();
      }
    });
  }

  // A link may name any form of a symbol in the page's family ("#1,1/2,1/2;1,1/2,3/2;1,1,2"):
  // it is taken to the row the form is filed under, and the form is shown with its own value.
  function followForm() {
    var hash = decodeURIComponent(location.hash.slice(1));
    if (!hash || doc.getElementById(hash) || !DATA) return;
    var famKey = doc.body.className, id = null;
    KIND_ORDER.forEach(function (k) { if (!id && KINDS[k].family === famKey && !KINDS[k].map) id = k; });
    if (!id) return;
    var k = KINDS[id], parts = hash.split(";"), t = [], res;
    if (parts.length !== k.groups.length) return;
    try {
      k.groups.forEach(function (g, gi) {
        var items = parts[gi].split(",");
        if (items.length !== g.length) throw new InputError("shape");
        g.forEach(function (at, i) { t[at] = doubled(items[i], k.names[at]); });
      });
      res = resolve(id, t);
    } catch (e) {
      if (e instanceof InputError) return;
      throw e;
    }
    if (res.kind !== "ok") { showBanner(writeSymbol(k, t) + ": " + res.text, null); return; }
    var state = { fam: id, values: t.map(half), to: res.path + "#" + res.anchor, note: res.text,
      typed: res.typed, factor: res.factor };
    remember(state);
    if (res.path === HERE) { location.replace("#" + res.anchor); showBanner(res.text, state); }
    else location.replace(ROOT + res.path + "#" + res.anchor);
  }

  // On a narrow screen the box is folded away (CSS) behind a button in the bar.
  function addFindToggle(box) {
    var bar = doc.querySelector(".top .bar"), top = box.parentNode;
    if (!bar) return;
    var b = doc.createElement("button");
    b.type = "button";
    b.className = "find";
    b.textContent = "Go to\u2026";
    b.setAttribute("aria-expanded", "false");
    b.addEventListener("click", function () {
      var open = !top.classList.contains("open");
      top.classList.toggle("open", open);
      b.setAttribute("aria-expanded", String(open));
      if (open) { var first = box.querySelector("input"); if (first) first.focus(); }
    });
    bar.appendChild(b);
  }

  function start() {
    addTwinLinks();
    addCopyButtons();
    var box = doc.getElementById("jump");
    if (box && DATA && KIND_ORDER.length) { buildBox(box); addFindToggle(box); }
    followForm();
    window.addEventListener("hashchange", followForm);
  }

  if (doc.readyState === "loading") doc.addEventListener("DOMContentLoaded", start);
  else start();
})();
