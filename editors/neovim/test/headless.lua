-- Headless Neovim against the real server: open an example, wait for its
-- diagnostics, ask for a hover and for formatting, check the answers. Works with
-- Neovim 0.7 and later (the Debian package), so it starts the client with
-- vim.lsp.start_client and the same cmd as lsp/parax.lua.
local root = assert(os.getenv("PARAX_ROOT"), "PARAX_ROOT is not set")
vim.g.parax_path = assert(os.getenv("PARAX_BIN"), "PARAX_BIN is not set")

local function check()
  local cfg = dofile(root .. "/editors/neovim/lsp/parax.lua")
  assert(cfg.cmd[2] == "lsp" and cfg.filetypes[1] == "parax", "lsp/parax.lua is not the parax config")
  -- A scratch copy, so the example itself is never changed.
  local tmp = vim.fn.tempname() .. ".parax"
  vim.fn.writefile(vim.fn.readfile(root .. "/examples/clinic-review.parax"), tmp)
  vim.cmd("edit " .. tmp)
  local buf = vim.api.nvim_get_current_buf()
  local id = vim.lsp.start_client({ name = "parax", cmd = cfg.cmd, root_dir = root })
  assert(id, "the client did not start")
  vim.lsp.buf_attach_client(buf, id)

  -- Diagnostics: the example has two vertex notes (P0303) and no error.
  assert(vim.wait(15000, function() return #vim.diagnostic.get(buf) >= 2 end, 50), "no diagnostics arrived")
  for _, d in ipairs(vim.diagnostic.get(buf)) do
    assert(d.code == "P0303", "unexpected diagnostic " .. tostring(d.code))
  end

  -- Hover on the keratometry line: the mean K derivation and its source.
  local uri = vim.uri_from_bufnr(buf)
  local res = vim.lsp.buf_request_sync(buf, "textDocument/hover",
    { textDocument = { uri = uri }, position = { line = 11, character = 20 } }, 10000)
  local value = res and res[id] and res[id].result and res[id].result.contents.value or ""
  assert(value:find("mean K", 1, true), "hover lacks the mean K: " .. value)
  assert(value:find("Shammas", 1, true), "hover lacks the source: " .. value)

  -- Formatting: spoil the layout of line 11 (an incremental change), format,
  -- apply the edits, and expect the canonical line back.
  vim.api.nvim_buf_set_lines(buf, 10, 11, false, { "    add    +1.50" })
  local client = vim.lsp.get_client_by_id(id)
  local fmt = vim.lsp.buf_request_sync(buf, "textDocument/formatting",
    { textDocument = { uri = uri }, options = { tabSize = 2, insertSpaces = true } }, 10000)
  local edits = fmt and fmt[id] and fmt[id].result
  assert(edits and #edits > 0, "formatting returned no edits")
  vim.lsp.util.apply_text_edits(edits, buf, client.offset_encoding or "utf-16")
  local line = vim.api.nvim_buf_get_lines(buf, 10, 11, false)[1]
  assert(line == "  add +1.50", "formatted line is '" .. line .. "'")
  os.remove(tmp)
end

local ok, err = pcall(check)
if ok then
  io.stdout:write("neovim headless: diagnostics, hover and formatting ok\n")
  vim.cmd("qall!")
else
  io.stderr:write("neovim headless test failed: " .. tostring(err) .. "\n")
  vim.cmd("cquit 1")
end
