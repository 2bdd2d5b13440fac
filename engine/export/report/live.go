package report

import "strings"

// live writes the script of the live preview: it listens to the server's
// events and puts each new version of the report in place of the old one,
// keeping the reader's scroll position (no reload, so no flicker).
func (d *doc) live() {
	d.w(`<script>
(function () {
  var es = new EventSource(`, jsString(d.opt.Live), `);
  es.onopen = function () { document.documentElement.setAttribute("data-live", "open"); };
  es.onerror = function () { document.documentElement.setAttribute("data-live", "lost"); };
  es.addEventListener("report", function (e) {
    var y = window.scrollY;
    document.getElementById("report").innerHTML = e.data;
    window.scrollTo(0, y);
    document.title = document.querySelector("h1") ? document.querySelector("h1").textContent : document.title;
  });
})();
</script>
`)
}

// jsString quotes s for a script.
func jsString(s string) string {
	out := []byte{'"'}
	for _, r := range s {
		switch {
		case r == '"' || r == '\\':
			out = append(out, '\\', byte(r))
		case r == '<':
			out = append(out, `\x3c`...)
		case r < 0x20:
			out = append(out, ' ')
		default:
			out = append(out, string(r)...)
		}
	}
	return string(append(out, '"'))
}

// Body returns the content of the report's main element alone, which the
// live preview sends to the open page after each save.
func Body(html string) string {
	const open, end = "<main id=\"report\">\n", "</main>\n"
	i := strings.Index(html, open)
	j := strings.LastIndex(html, end)
	if i < 0 || j < i {
		return html
	}
	return html[i+len(open) : j]
}
