-- hmb calc files. vim.filetype.add needs Neovim 0.8; Debian 12 ships 0.7, hence the autocommand.
if vim.filetype and vim.filetype.add and vim.fn.has('nvim-0.8') == 1 then
  vim.filetype.add({ extension = { hmb = 'hmb' } })
else
  vim.cmd([[autocmd BufRead,BufNewFile *.hmb setfiletype hmb]])
end
