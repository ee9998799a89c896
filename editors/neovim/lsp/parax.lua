-- The parax language server for Neovim's built-in client (`vim.lsp.enable`,
-- Neovim 0.11 or later). Put this folder on 'runtimepath' and call
-- `vim.lsp.enable("parax")`. Set `vim.g.parax_path` to use a parax that is not
-- on PATH.
return {
  cmd = { vim.g.parax_path or "parax", "lsp" },
  filetypes = { "parax" },
  root_markers = { ".git" },
}
