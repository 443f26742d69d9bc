package main

// The completion scripts. Each passes the words typed so far to
// `drawdown __complete` (see cmd_completion.go) and offers what it prints.
// They call the same drawdown the user typed (the first word), so a build
// run as ./drawdown completes from itself.

const bashCompletion = `# bash completion for drawdown
#   source <(drawdown completion bash)
# or save as ~/.local/share/bash-completion/completions/drawdown
_drawdown_complete() {
	local cur="${COMP_WORDS[COMP_CWORD]}" line kind=""
	[[ $cur == "=" ]] && cur=""
	local -a found=()
	while IFS= read -r line; do
		case $line in
		:file) kind=file ;;
		:dir) kind=dir ;;
		"") ;;
		*) found+=("${line%%$'\t'*}") ;;
		esac
	done < <("${COMP_WORDS[0]}" __complete "${COMP_WORDS[@]:1:COMP_CWORD-1}" "$cur" 2>/dev/null)
	COMPREPLY=("${found[@]}")
	if [[ -n $kind ]]; then
		compopt -o filenames 2>/dev/null
		local IFS=$'\n'
		if [[ $kind == dir ]]; then
			COMPREPLY+=($(compgen -d -- "$cur"))
		else
			COMPREPLY+=($(compgen -f -- "$cur"))
		fi
	fi
}
complete -F _drawdown_complete drawdown
`

const zshCompletion = `#compdef drawdown
# zsh completion for drawdown
#   source <(drawdown completion zsh)      (in ~/.zshrc, after compinit)
_drawdown_complete() {
	local -a found lines
	local line value note kind=""
	lines=("${(@f)$(${words[1]} __complete "${(@)words[2,CURRENT-1]}" "${words[CURRENT]}" 2>/dev/null)}")
	for line in "${lines[@]}"; do
		case $line in
		:file) kind=file ;;
		:dir) kind=dir ;;
		"") ;;
		*)
			value=${line%%$'\t'*}
			value=${value//:/\\:}
			if [[ $line == *$'\t'* ]]; then
				note=${line#*$'\t'}
				found+=("$value:$note")
			else
				found+=("$value")
			fi
			;;
		esac
	done
	(( ${#found} )) && _describe -t values drawdown found
	case $kind in
	file) _files ;;
	dir) _files -/ ;;
	esac
	return 0
}
compdef _drawdown_complete drawdown
`

const fishCompletion = `# fish completion for drawdown
#   drawdown completion fish | source
# or save as ~/.config/fish/completions/drawdown.fish
function __drawdown_complete
	set -l tokens (commandline -opc)
	set -l cur (commandline -ct)
	for line in ($tokens[1] __complete $tokens[2..-1] "$cur" 2>/dev/null)
		switch $line
			case :file
				__fish_complete_path "$cur"
			case :dir
				__fish_complete_directories "$cur"
			case '*'
				echo $line
		end
	end
end
complete -c drawdown -f -a '(__drawdown_complete)'
`
