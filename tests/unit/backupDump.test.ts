import { describe, expect, it } from 'vitest'
import { countRows } from '../../scripts/stack/dump'
import { folderName } from '../../scripts/stack/backup'

describe('rows counted from a database dump', () => {
  it('counts one tuple a line, as mariadb-dump 10.11 writes them, and lists empty tables', async () => {
    const dump = [
      'CREATE TABLE `users` (',
      '  `id` int(10) unsigned NOT NULL AUTO_INCREMENT,',
      ') ENGINE=InnoDB;',
      'CREATE TABLE `notes` (',
      ') ENGINE=InnoDB;',
      'INSERT INTO `users` VALUES',
      '(1,\'Ines\',NULL),',
      '(2,\'Tomas\',0x00FF);',
    ]
    expect(await countRows(dump)).toEqual({ users: 2, notes: 0 })
  })

  it('counts a whole statement on one line, as older versions write it', async () => {
    expect(await countRows(['INSERT INTO `t` VALUES (1,\'a\'),(2,\'b\'),(3,\'c\');'])).toEqual({ t: 3 })
  })

  it('is not misled by parentheses, quotes, semicolons or backslashes inside strings', async () => {
    const dump = [
      'INSERT INTO `t` VALUES',
      '(1,\'a),(b\'),',
      '(2,\'it\\\'s; (really)\'),',
      '(3,\'ends in a backslash \\\\\'),',
      '(4,\'line\\nbreak \\"quoted\\"\');',
      'INSERT INTO `t` VALUES',
      '(5,\'\');',
    ]
    expect(await countRows(dump)).toEqual({ t: 5 })
  })

  it('skips the bodies of triggers and routines, and unquotes table names', async () => {
    const dump = [
      'CREATE TABLE `odd``name` (',
      'DELIMITER ;;',
      'INSERT INTO `odd``name` VALUES (1) ;;',
      'DELIMITER ;',
      'INSERT INTO `odd``name` VALUES (7);',
    ]
    expect(await countRows(dump)).toEqual({ 'odd`name': 1 })
  })
})

describe('backup folder names', () => {
  it('are the UTC time to the second, without characters a file system refuses', () => {
    expect(folderName(new Date('2026-12-01T21:50:00.123Z'))).toBe('2026-12-01T21-50-00Z')
  })
})
