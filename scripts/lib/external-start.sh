#!/usr/bin/env bash
# Trunk post-build hook: moves the inline start-up module trunk writes into index.html
# into a file of its own, so the page's Content Security Policy can forbid every inline
# script (web/index.html). Runs in trunk's staging folder ($TRUNK_STAGING_DIR).
set -euo pipefail
cd "${TRUNK_STAGING_DIR:?run by trunk as a post_build hook}"
start=$(awk '/^<script type="module">$/{inside=1; next} inside && /<\/script>/{exit} inside{print}' index.html)
# trunk writes the tag alone on its line, the module on the lines after it; anything else
# (the whole script on one line, a changed tag) would be cut wrongly: refuse it
if [ "$(grep -c '^<script type="module">$' index.html)" != 1 ] || ! printf '%s' "$start" | grep -q 'import init'; then
    echo "external-start: index.html does not hold trunk's start-up module as expected" >&2
    exit 1
fi
name="start-$(printf '%s' "$start" | cksum | cut -d' ' -f1).js"
printf '%s\n' "$start" > "$name"
awk -v src="/$name" '
    /^<script type="module">$/ { inside = 1; printf "<script type=\"module\" src=\"%s\"></script>\n", src; next }
    inside && /<\/script>/ { inside = 0; next }
    !inside { print }
' index.html > index.html.next
mv index.html.next index.html
