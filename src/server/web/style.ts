// The supervisor pages' stylesheet, served as /supervisor/style.css (the CSP allows no inline styles).
export const SUPERVISOR_CSS = `
:root { color-scheme: light; font-family: system-ui, sans-serif; color: #1d2b36; background: #f4f6f8; }
body { margin: 0; }
header { background: #1d2b36; color: #fff; padding: 0.75rem 1.25rem; display: flex; gap: 1.5rem; align-items: center; }
header a { color: #fff; }
header form { margin-left: auto; }
main { padding: 1.25rem; max-width: 72rem; }
h1 { font-size: 1.4rem; }
table { border-collapse: collapse; width: 100%; background: #fff; }
th, td { text-align: left; padding: 0.5rem; border-bottom: 1px solid #d5dce3; vertical-align: top; }
.kid { font-family: ui-monospace, monospace; font-size: 0.85rem; }
.badge { display: inline-block; padding: 0.1rem 0.4rem; border: 1px solid currentColor; border-radius: 0.25rem; font-size: 0.8rem; }
.revoked { color: #8a1c1c; }
.demo { color: #6b4e00; }
.panel { background: #fff; border: 1px solid #d5dce3; padding: 1rem; margin: 1rem 0; }
.code { font-family: ui-monospace, monospace; font-size: 2rem; letter-spacing: 0.15em; }
.qr { width: 14rem; height: 14rem; }
.error { color: #8a1c1c; font-weight: 600; }
.notice { color: #1d5a2c; font-weight: 600; }
label { display: block; margin: 0.5rem 0; }
input[type=text], input[type=password] { font-size: 1rem; padding: 0.35rem; }
button { font-size: 1rem; padding: 0.35rem 0.8rem; }
form.inline { display: inline; }
`;
