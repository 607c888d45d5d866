" Syntax for hmb calc files (heat and material balances of steam and water systems).
if exists('b:current_syntax')
  finish
endif

" Names are a letter or _, then letters, digits, _ or -.
syn iskeyword @,48-57,_,-,192-255

syn match   hmbComment   "#.*$" contains=@Spell
syn region  hmbString    start=+"+ skip=+\\.+ end=+"+ end=+$+ contains=hmbEscape oneline
syn match   hmbEscape    +\\.+ contained

syn keyword hmbStatement stream nextgroup=hmbStreamDecl skipwhite
syn match   hmbStreamDecl "\k\+\%(\s*,\s*\k\+\)*" contained contains=hmbComma
syn keyword hmbStatement expect nextgroup=hmbTarget skipwhite
syn keyword hmbStatement case sweep nextgroup=hmbCaseDecl skipwhite
syn match   hmbCaseDecl  "\k\+" contained
syn keyword hmbStudyWord free from to step count show
syn match   hmbTarget    "\k\+" contained nextgroup=hmbProperty skipwhite
syn keyword hmbSetting   title atmosphere elevation tolerance ambient project document revision prepared_by checked_by date display_flow display_vol_flow display_pressure display_temperature display_enthalpy display_entropy display_volume display_density display_power display_duty display_heat_rate
syn keyword hmbSetting   display nextgroup=hmbSystem skipwhite
syn keyword hmbSystem    SI US contained
syn keyword hmbKind      boiler cooler deaerator desuperheater exchanger flash heater mixer pump splitter turbine valve nextgroup=hmbUnitDecl skipwhite
syn match   hmbUnitDecl  "\k\+" contained
syn keyword hmbRole      in out blowdown vent steam water hot_in hot_out cold_in cold_out vapor liquid vapour
syn keyword hmbProperty  flow p T h s x v rho vol_flow Tsat superheat subcooling power_out power_in net_power heat_in heat_out efficiency heat_rate duty dp fuel T_boundary blowdown_rate sgen heat_loss vent_rate dp_hot dp_cold arrangement min_approach dT_min lmtd UA power
syn keyword hmbProperty  fluid nextgroup=hmbFluid skipwhite
syn keyword hmbFluid     water steam contained
syn keyword hmbOperator  within
syn match   hmbOperator  "<=\|>=\|[=<>]\|±\|+/-\|+-"
syn match   hmbComma     "," contained

" A number and the unit spelling after it: 150 psig, 9000 lbm/h, 480 °F, 1.2 kJ/(kg K).
syn match   hmbNumber    "\k\@1<!\.\@1<![-+]\=\%(\d\+\%(\.\d*\)\=\|\.\d\+\)\%([eE][-+]\=\d\+\)\=" nextgroup=hmbUnit skipwhite
syn match   hmbUnit      "\%(\%(within\|to\|step\|count\)\>\)\@![^ \t{},;#\"=<>±()0-9.+-]\%([^ \t{},;#\"=<>±(]\|([^)]*)\)*" contained

hi def link hmbComment    Comment
hi def link hmbString     String
hi def link hmbEscape     SpecialChar
hi def link hmbStatement  Statement
hi def link hmbStreamDecl Identifier
hi def link hmbTarget     Identifier
hi def link hmbCaseDecl   Identifier
hi def link hmbStudyWord  Keyword
hi def link hmbSetting    PreProc
hi def link hmbSystem     Constant
hi def link hmbKind       Type
hi def link hmbUnitDecl   Function
hi def link hmbRole       Label
hi def link hmbProperty   Identifier
hi def link hmbFluid      Constant
hi def link hmbOperator   Operator
hi def link hmbNumber     Number
hi def link hmbUnit       Special

let b:current_syntax = 'hmb'
