" Indentation for hmb calc files: one level inside each { } block.
if exists('b:did_indent')
  finish
endif
let b:did_indent = 1

setlocal indentexpr=GetHmbIndent(v:lnum)
setlocal indentkeys=0},!^F,o,O
setlocal autoindent
let b:undo_indent = 'setlocal indentexpr< indentkeys< autoindent<'

if exists('*GetHmbIndent')
  finish
endif

" s:Code is a line without its comment and strings, so that braces inside them do not count.
function! s:Code(lnum) abort
  let line = substitute(getline(a:lnum), '"\%([^"\\]\|\\.\)*"\=', '""', 'g')
  return substitute(line, '#.*$', '', '')
endfunction

function! GetHmbIndent(lnum) abort
  let prev = prevnonblank(a:lnum - 1)
  while prev > 0 && getline(prev) =~# '^\s*#'
    let prev = prevnonblank(prev - 1)
  endwhile
  if prev == 0
    return 0
  endif
  let code = s:Code(prev)
  let ind = indent(prev)
  let opened = len(substitute(code, '[^{]', '', 'g'))
  let closed = len(substitute(code, '[^}]', '', 'g'))
  " A leading } was already outdented on its own line.
  if code =~# '^\s*}'
    let closed -= 1
  endif
  let ind += shiftwidth() * (opened - closed)
  if getline(a:lnum) =~# '^\s*}'
    let ind -= shiftwidth()
  endif
  return max([ind, 0])
endfunction
