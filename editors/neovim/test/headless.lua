-- Headless Neovim against the real server: open an example, wait for its
-- diagnostics, ask for a hover and for formatting, check the answers.
--
-- Two paths, chosen by the Neovim that runs it:
-- * Neovim 0.11 and later: the setup the README gives a user. This folder goes
--   on 'runtimepath', ftdetect/parax.lua makes the file type, and
--   vim.lsp.enable("parax") starts the server from lsp/parax.lua by itself;
--   the test also asks for the inlay hints and formats with vim.lsp.buf.format.
-- * Neovim 0.7 to 0.10 (Debian bookworm has 0.7.2): vim.lsp.enable does not
--   exist, so the client is started with vim.lsp.start_client and the cmd of
--   lsp/parax.lua.
local root = assert(os.getenv("PARAX_ROOT"), "PARAX_ROOT is not set")
vim.g.parax_path = assert(os.getenv("PARAX_BIN"), "PARAX_BIN is not set")
local modern = vim.lsp.enable ~= nil

local function check()
  local cfg = dofile(root .. "/editors/neovim/lsp/parax.lua")
  assert(cfg.cmd[2] == "lsp" and cfg.filetypes[1] == "parax", "lsp/parax.lua is not the parax config")
  -- A scratch copy, so the example itself is never changed.
  local tmp = vim.fn.tempname() .. ".parax"
  vim.fn.writefile(vim.fn.readfile(root .. "/examples/clinic-review.parax"), tmp)
  local id
  local buf
  if modern then
    -- What a user's init.lua does (README); `runtime!` stands in for the
    -- start-up scan of ftdetect/, which ran before this script.
    vim.opt.runtimepath:append(root .. "/editors/neovim")
    vim.cmd("runtime! ftdetect/parax.lua")
    vim.lsp.enable("parax")
    vim.cmd("edit " .. tmp)
    buf = vim.api.nvim_get_current_buf()
    assert(vim.bo[buf].filetype == "parax", "filetype is '" .. vim.bo[buf].filetype .. "', not parax")
    assert(vim.wait(10000, function() return #vim.lsp.get_clients({ bufnr = buf, name = "parax" }) == 1 end, 50),
      "vim.lsp.enable did not start parax for the buffer")
    id = vim.lsp.get_clients({ bufnr = buf, name = "parax" })[1].id
  else
    vim.cmd("edit " .. tmp)
    buf = vim.api.nvim_get_current_buf()
    id = vim.lsp.start_client({ name = "parax", cmd = cfg.cmd, root_dir = root })
    assert(id, "the client did not start")
    vim.lsp.buf_attach_client(buf, id)
  end

  if modern and os.getenv("PARAX_TS_PARSER") then
    -- Tree-sitter highlighting as the README sets it up: the grammar of
    -- editors/tree-sitter-parax (compiled by run.sh) and its highlight query.
    vim.treesitter.language.add("parax", { path = os.getenv("PARAX_TS_PARSER") })
    local query = table.concat(vim.fn.readfile(root .. "/editors/tree-sitter-parax/queries/highlights.scm"), "\n")
    vim.treesitter.query.set("parax", "highlights", query)
    vim.treesitter.start(buf, "parax")
    local tree = vim.treesitter.get_parser(buf, "parax"):parse()[1]
    assert(not tree:root():has_error(), "tree-sitter finds errors in the example")
    local function captures(row, col)
      local names = {}
      for _, c in ipairs(vim.treesitter.get_captures_at_pos(buf, row, col)) do
        table.insert(names, c.capture)
      end
      return table.concat(names, ",")
    end
    -- Line 9 `eye right`, line 10 `  refraction -5.75 / -1.50 x 175 @ 12 mm  # ...`.
    for _, want in ipairs({
      { 8, 0, "keyword" }, { 8, 4, "constant" }, { 9, 2, "property" }, { 9, 13, "number" },
      { 9, 19, "punctuation.delimiter" }, { 9, 27, "operator" }, { 9, 38, "type.builtin" },
      { 9, 42, "comment" }, { 2, 5, "string" }, { 3, 7, "string.special" },
    }) do
      local got = captures(want[1], want[2])
      assert(got == want[3], string.format("tree-sitter capture at %d:%d is '%s', not '%s'",
        want[1] + 1, want[2], got, want[3]))
    end
  end

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

  if modern then
    -- Inlay hints: the computed values at the end of the refraction line (line 10).
    local hints = vim.lsp.buf_request_sync(buf, "textDocument/inlayHint", {
      textDocument = { uri = uri },
      range = { start = { line = 0, character = 0 }, ["end"] = { line = 20, character = 0 } },
    }, 10000)
    local list = hints and hints[id] and hints[id].result or {}
    local on_refraction = {}
    for _, h in ipairs(list) do
      if h.position.line == 9 then
        local label = type(h.label) == "string" and h.label or h.label[1].value
        table.insert(on_refraction, label)
      end
    end
    assert(#on_refraction > 0, "no inlay hint on the refraction line")
  end

  -- Formatting: spoil the layout of line 11 (an incremental change), format,
  -- apply the edits, and expect the canonical line back.
  vim.api.nvim_buf_set_lines(buf, 10, 11, false, { "    add    +1.50" })
  local client = vim.lsp.get_client_by_id(id)
  if modern then
    vim.lsp.buf.format({ bufnr = buf, id = id, async = false, timeout_ms = 10000 })
  else
    local fmt = vim.lsp.buf_request_sync(buf, "textDocument/formatting",
      { textDocument = { uri = uri }, options = { tabSize = 2, insertSpaces = true } }, 10000)
    local edits = fmt and fmt[id] and fmt[id].result
    assert(edits and #edits > 0, "formatting returned no edits")
    vim.lsp.util.apply_text_edits(edits, buf, client.offset_encoding or "utf-16")
  end
  local line = vim.api.nvim_buf_get_lines(buf, 10, 11, false)[1]
  assert(line == "  add +1.50", "formatted line is '" .. line .. "'")
  os.remove(tmp)
end

local ok, err = pcall(check)
if ok then
  local v = vim.version()
  io.stdout:write(string.format("neovim %d.%d.%d", v.major, v.minor, v.patch) .. " headless ("
    .. (modern and "vim.lsp.enable" or "vim.lsp.start_client")
    .. "): diagnostics, hover" .. (modern and ", inlay hints" or "")
    .. ((modern and os.getenv("PARAX_TS_PARSER")) and ", tree-sitter highlighting" or "")
    .. " and formatting ok\n")
  vim.cmd("qall!")
else
  io.stderr:write("neovim headless test failed: " .. tostring(err) .. "\n")
  vim.cmd("cquit 1")
end
