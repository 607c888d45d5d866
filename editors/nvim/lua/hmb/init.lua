-- hmb for Neovim: starts `hmb lsp` for hmb buffers. Plain Lua: no plugin manager, no lspconfig.
--
--   require('hmb').setup({ cmd = { '/path/to/hmb', 'lsp' } })   -- optional; default: hmb on PATH
--
-- ftplugin/hmb.lua calls start() for every hmb buffer unless vim.g.hmb_lsp == false.
local M = {}

M.config = {
  cmd = { 'hmb', 'lsp' },
  -- The server is shared by the files below the first directory holding one of these.
  root_markers = { '.git', '.hg' },
}

function M.setup(opts)
  M.config = vim.tbl_deep_extend('force', M.config, opts or {})
end

local function root_dir(bufnr)
  local name = vim.api.nvim_buf_get_name(bufnr)
  local dir = name ~= '' and vim.fn.fnamemodify(name, ':p:h') or vim.fn.getcwd()
  for _, marker in ipairs(M.config.root_markers) do
    local found = vim.fn.finddir(marker, dir .. ';')
    if found == '' then
      found = vim.fn.findfile(marker, dir .. ';')
    end
    if found ~= '' then
      return vim.fn.fnamemodify(found, ':p:h:h')
    end
  end
  return dir
end

local warned = false
local clients = {} -- root directory -> client id, for Neovim 0.7 without vim.lsp.start

-- start attaches bufnr to an hmb language server for its root directory, starting one if needed,
-- and returns the client id (nil when hmb cannot be found).
function M.start(bufnr)
  if bufnr == nil or bufnr == 0 then
    bufnr = vim.api.nvim_get_current_buf()
  end
  local cmd = M.config.cmd
  if vim.fn.executable(cmd[1]) ~= 1 then
    if not warned then
      warned = true
      vim.notify(('hmb: %q not found; install hmb or call require("hmb").setup({ cmd = { "/path/to/hmb", "lsp" } })'):format(cmd[1]),
        vim.log.levels.WARN)
    end
    return nil
  end
  local config = { name = 'hmb', cmd = cmd, root_dir = root_dir(bufnr) }
  if vim.lsp.start then -- Neovim 0.8 and later reuse a client with the same name and root
    return vim.lsp.start(config, { bufnr = bufnr })
  end
  local id = clients[config.root_dir]
  local client = id and vim.lsp.get_client_by_id(id)
  if not client or client.is_stopped() then
    id = vim.lsp.start_client(config)
    clients[config.root_dir] = id
  end
  if id then
    vim.lsp.buf_attach_client(bufnr, id)
  end
  return id
end

return M
