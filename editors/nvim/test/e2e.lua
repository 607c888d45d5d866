-- End-to-end test of the Neovim set-up against a real `hmb lsp`: filetype detection, syntax,
-- indentation, diagnostics and hover on fixture.hmb (whose two mistakes are there on purpose),
-- then every example in testdata/examples, whose diagnostics must equal `hmb check`'s.
-- Run by test/run.sh; exits non-zero when a check fails.
local here = vim.fn.fnamemodify(debug.getinfo(1, 'S').source:sub(2), ':p:h')
local failures = 0

local function log(msg)
  io.stderr:write(msg .. '\n')
end

local function check(ok, msg)
  if ok then
    log('ok   ' .. msg)
  else
    failures = failures + 1
    log('FAIL ' .. msg)
  end
end

local function finish()
  if failures > 0 then
    log(('%d check(s) failed'):format(failures))
    vim.cmd('cquit 1')
  end
  log('all checks passed')
  vim.cmd('qall!')
end

require('hmb').setup({ cmd = { vim.env.HMB or 'hmb', 'lsp' } })
vim.cmd('edit ' .. vim.fn.fnameescape(here .. '/fixture.hmb'))
local buf = vim.api.nvim_get_current_buf()

check(vim.bo.filetype == 'hmb', 'filetype detected as hmb (got ' .. vim.bo.filetype .. ')')
check(vim.bo.commentstring == '# %s', 'commentstring from ftplugin')

-- Syntax groups at (1-based line, 1-based column) of fixture.hmb.
local function group(line, col)
  return vim.fn.synIDattr(vim.fn.synID(line, col, 1), 'name')
end
for _, c in ipairs({
  { 1, 1, 'hmbComment' }, { 2, 1, 'hmbSetting' }, { 2, 7, 'hmbString' }, { 3, 9, 'hmbSystem' },
  { 5, 1, 'hmbStatement' }, { 5, 8, 'hmbStreamDecl' }, { 5, 35, 'hmbProperty' },
  { 5, 40, 'hmbNumber' }, { 5, 42, 'hmbUnit' }, { 8, 1, 'hmbKind' }, { 8, 7, 'hmbUnitDecl' },
  { 9, 3, 'hmbRole' },
}) do
  local got = group(c[1], c[2])
  check(got == c[3], ('syntax at %d:%d is %s (got %s)'):format(c[1], c[2], c[3], got))
end

-- Indentation: a new entry inside the valve block, and its closing brace.
check(vim.fn.GetHmbIndent(10) == 2, 'indent inside a block is 2')
check(vim.fn.GetHmbIndent(11) == 0, 'closing brace is outdented')

-- Diagnostics published by hmb lsp.
local function clients()
  if vim.lsp.get_clients then -- Neovim 0.10 and later
    return vim.lsp.get_clients({ bufnr = buf })
  end
  return vim.lsp.buf_get_clients(buf)
end
local attached = vim.wait(10000, function()
  return next(clients()) ~= nil
end, 50)
check(attached, 'hmb lsp attached to the buffer')
if not attached then
  finish()
end
local got = vim.wait(15000, function()
  return #vim.diagnostic.get(buf) >= 2
end, 50)
check(got, 'diagnostics arrived')
local diags = vim.diagnostic.get(buf)
table.sort(diags, function(a, b)
  return a.lnum < b.lnum or a.lnum == b.lnum and a.col < b.col
end)
local function find(code)
  for _, d in ipairs(diags) do
    local c = d.code or (d.user_data and d.user_data.lsp and d.user_data.lsp.code)
    if c == code then
      return d
    end
  end
end
for _, d in ipairs(diags) do
  log(('     diagnostic %d:%d %s %s'):format(d.lnum + 1, d.col + 1, tostring(d.code), d.message))
end
-- Line 6: "p 10 bra" misspells bar; line 10: "out LQ" names an undeclared stream.
local unit = find('HMB301')
check(unit ~= nil and unit.lnum == 5 and unit.col == 34 and unit.end_col == 37
  and unit.severity == vim.diagnostic.severity.ERROR and unit.message:find('bra', 1, true) ~= nil,
  'HMB301 error on the unit spelling "bra" at 6:35-6:38')
local undef = find('HMB201')
check(undef ~= nil and undef.lnum == 9 and undef.col == 6 and undef.end_col == 8
  and undef.severity == vim.diagnostic.severity.ERROR and undef.message:find('LQ', 1, true) ~= nil,
  'HMB201 error on the undeclared stream LQ at 10:7-10:9')

-- Hover over the stream HP where the valve takes it in (line 9, column 6).
local function hover(line, character)
  local res = vim.lsp.buf_request_sync(buf, 'textDocument/hover', {
    textDocument = { uri = vim.uri_from_bufnr(buf) },
    position = { line = line, character = character },
  }, 10000)
  for _, r in pairs(res or {}) do
    if r.result and r.result.contents then
      local c = r.result.contents
      return type(c) == 'table' and (c.value or c[1]) or c
    end
  end
end
local text = hover(8, 6)
log('     hover: ' .. tostring(text):gsub('\n', ' | '):sub(1, 200))
check(type(text) == 'string' and text:find('`HP`', 1, true) ~= nil
  and text:find('high-pressure steam', 1, true) ~= nil,
  'hover on HP names the stream and its label')

-- Hover over the unit kind "valve" (line 8, column 1): the kind's description.
local kind = hover(7, 0)
log('     hover: ' .. tostring(kind):gsub('\n', ' | '):sub(1, 200))
check(type(kind) == 'string' and kind:find('throttling', 1, true) ~= nil,
  'hover on valve describes a throttling valve')

-- Every example in testdata/examples: the editor shows what `hmb check --format json` reports
-- for the same file (the CLI is the reference; nothing about the examples is written here).
-- A file without findings still gets a (empty) publication; count them per URI so that "no
-- diagnostics" means the server has spoken, not that it has not answered yet.
local published = {}
local publish = vim.lsp.handlers['textDocument/publishDiagnostics']
vim.lsp.handlers['textDocument/publishDiagnostics'] = function(err, result, ctx, config)
  if result then
    published[result.uri] = (published[result.uri] or 0) + 1
  end
  return publish(err, result, ctx, config)
end
local examples = vim.fn.glob(here .. '/../../../testdata/examples/*.hmb', false, true)
check(#examples > 0, ('found %d examples'):format(#examples))
for _, file in ipairs(examples) do
  file = vim.fn.fnamemodify(file, ':p')
  local name = vim.fn.fnamemodify(file, ':t')
  local out = vim.fn.system({ vim.env.HMB or 'hmb', 'check', '--format', 'json', file })
  local ok, report = pcall(vim.fn.json_decode, out)
  check(ok and type(report) == 'table', name .. ': hmb check --format json gives JSON')
  if ok and type(report) == 'table' then
    local want = {}
    for _, d in ipairs(report.files[1].diagnostics or {}) do
      table.insert(want, ('%d:%d %s %s'):format(d.range.start.line, d.range.start.column, d.code, d.message))
    end
    table.sort(want)
    vim.cmd('edit ' .. vim.fn.fnameescape(file))
    local b = vim.api.nvim_get_current_buf()
    local uri = vim.uri_from_bufnr(b)
    local got
    local function agrees()
      got = {}
      for _, d in ipairs(vim.diagnostic.get(b)) do
        table.insert(got, ('%d:%d %s %s'):format(d.lnum + 1, d.col + 1, tostring(d.code), d.message))
      end
      table.sort(got)
      return (published[uri] or 0) > 0 and vim.deep_equal(got, want)
    end
    local same = vim.wait(15000, agrees, 50)
    if same then -- a later publication (the solve after the syntax check) must not change it
      vim.wait(300)
      same = agrees()
    end
    check(same, ('%s: editor diagnostics equal hmb check (%d)'):format(name, #want))
    if not same then
      log('     hmb check: ' .. table.concat(want, ' || '))
      log('     editor:    ' .. table.concat(got, ' || '))
    end
  end
end

finish()
