-- Files ending in .parax are parax case files.
vim.filetype.add({ extension = { parax = "parax" } })
