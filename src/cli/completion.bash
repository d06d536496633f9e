# bash completion for coilspin, installed as
# <prefix>/share/bash-completion/completions/coilspin.
# Commands, options and option values are read from coilspin's own --help when
# asked for, so the completion follows whatever the installed binary offers:
#   coilspin <TAB>                  the commands (fit, demo, export, tune, ...)
#   coilspin export --<TAB>         that command's options
#   coilspin export x --format <TAB>  the values listed in braces in its help
#   anything else                   file names

_coilspin() {
  local cur=${COMP_WORDS[COMP_CWORD]} prev=${COMP_WORDS[COMP_CWORD-1]}
  local program=${COMP_WORDS[0]} command="" word k
  for ((k = 1; k < COMP_CWORD; k++)); do
    word=${COMP_WORDS[k]}
    if [[ $word != -* ]]; then
      command=$word
      break
    fi
  done
  if [[ -z $command ]]; then
    local commands
    commands=$("$program" --help 2>/dev/null | awk '/^Subcommands:/ {on = 1; next} on && NF {print $1}')
    COMPREPLY=($(compgen -W "$commands --help --help-all --version" -- "$cur"))
    return
  fi
  local help
  help=$("$program" "$command" --help 2>/dev/null)
  if [[ $prev == --* ]]; then
    # Values an option accepts, when its help lists them: --format TEXT:{spice,state-space,...}
    local values
    values=$(printf '%s\n' "$help" | grep -E -- "^ +(-[a-zA-Z],)?$prev " | grep -oE '\{[^}]*\}' | head -n 1 |
      tr -d '{}' | tr ',' ' ')
    if [[ -n $values ]]; then
      COMPREPLY=($(compgen -W "$values" -- "$cur"))
      return
    fi
  fi
  if [[ $cur == -* ]]; then
    COMPREPLY=($(compgen -W "$(printf '%s\n' "$help" | grep -oE -- '--[a-z][a-z-]*' | sort -u)" -- "$cur"))
  else
    compopt -o filenames 2>/dev/null
    COMPREPLY=($(compgen -f -- "$cur"))
  fi
}
complete -F _coilspin coilspin
